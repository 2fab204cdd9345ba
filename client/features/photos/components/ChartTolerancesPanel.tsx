import { useEffect, useState } from 'react';
import { toleranceLevelsInput } from '../../../../shared/schemas/chart';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { TextArea } from '../../../components/form/TextArea';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useChartTolerances, useSetChartTolerances } from '../api';

type Row = { name: string; meanDeltaE00: string; maxDeltaE00: string };
const MAX_LEVELS = 8;

/**
 * The levels a colour chart's capture is graded against: each a name and the mean ΔE00 on the chart's patches it
 * allows (and, if given, the largest), with the source they come from. A photo graded before keeps its figures;
 * its grade reads the levels anew when the chart is marked again.
 */
export function ChartTolerancesPanel() {
  const current = useChartTolerances();
  const save = useSetChartTolerances();
  const { formRef, errors, check, fromServer } = useFormErrors();
  const [rows, setRows] = useState<Row[] | null>(null);
  const [source, setSource] = useState('');
  const [saved, setSaved] = useState(false);
  useEffect(() => {
    if (!current.data || rows) return;
    setRows(
      current.data.levels.map((l) => ({
        name: l.name,
        meanDeltaE00: String(l.meanDeltaE00),
        maxDeltaE00: l.maxDeltaE00 == null ? '' : String(l.maxDeltaE00),
      })),
    );
    setSource(current.data.source);
  }, [current.data, rows]);
  if (current.isPending || !rows) return <p className="text-ink-soft">Loading the levels…</p>;
  if (current.error) return <FormAlert message={current.error.message} />;

  // Text that is not a number goes to the schema as typed, so its message says "as a number".
  const num = (s: string) => (s.trim() === '' ? undefined : Number.isFinite(Number(s)) ? Number(s) : s);
  const setRow = (i: number, k: keyof Row) => (e: { target: { value: string } }) => {
    setSaved(false);
    setRows(rows.map((r, j) => (j === i ? { ...r, [k]: e.target.value } : r)));
  };
  return (
    <form
      ref={formRef}
      noValidate
      aria-label="Imaging tolerance levels"
      className="max-w-3xl space-y-4 rounded-lg border border-rule bg-sheet p-5"
      onSubmit={(e) => {
        e.preventDefault();
        const data = check(toleranceLevelsInput, {
          levels: rows.map((r) => ({
            name: r.name,
            meanDeltaE00: num(r.meanDeltaE00),
            maxDeltaE00: r.maxDeltaE00.trim() === '' ? null : num(r.maxDeltaE00),
          })),
          source,
        });
        if (data) save.mutate(data, { onSuccess: () => setSaved(true), onError: fromServer });
      }}
    >
      <fieldset className="space-y-3">
        <legend className="text-sm font-medium">
          Levels, best first or in any order (the best one met is the grade)
        </legend>
        {rows.map((r, i) => (
          <div
            key={i}
            className="grid items-start gap-3 sm:grid-cols-[1fr_10rem_10rem_auto]"
            data-testid="tolerance-level"
          >
            <Field
              label={`Level ${i + 1}: name`}
              value={r.name}
              onChange={setRow(i, 'name')}
              error={errors[`levels.${i}.name`]}
            />
            <Field
              label="Mean ΔE00 at most"
              inputMode="decimal"
              value={r.meanDeltaE00}
              onChange={setRow(i, 'meanDeltaE00')}
              error={errors[`levels.${i}.meanDeltaE00`]}
            />
            <Field
              label="Largest ΔE00 (optional)"
              inputMode="decimal"
              value={r.maxDeltaE00}
              onChange={setRow(i, 'maxDeltaE00')}
              error={errors[`levels.${i}.maxDeltaE00`]}
            />
            <Button
              type="button"
              variant="quiet"
              className="sm:mt-6"
              disabled={rows.length === 1}
              aria-label={`Remove level ${i + 1}`}
              onClick={() => setRows(rows.filter((_, j) => j !== i))}
            >
              Remove
            </Button>
          </div>
        ))}
        {errors.levels ? <FormAlert message={errors.levels.join(' ')} /> : null}
        <Button
          type="button"
          variant="secondary"
          disabled={rows.length >= MAX_LEVELS}
          onClick={() => setRows([...rows, { name: '', meanDeltaE00: '', maxDeltaE00: '' }])}
        >
          Add a level
        </Button>
      </fieldset>
      <TextArea
        label="Source of the levels"
        rows={3}
        value={source}
        onChange={(e) => {
          setSaved(false);
          setSource(e.target.value);
        }}
        error={errors.source}
        hint="The guideline, its edition and what it measures; say so when the figures are recalled rather than read from it."
      />
      <FormAlert message={formMessage(save.error)} />
      {saved ? (
        <FormAlert tone="ok" message="Levels saved. Charts marked from now on are graded against them." />
      ) : null}
      <Button type="submit" disabled={save.isPending}>
        {save.isPending ? 'Saving…' : 'Save levels'}
      </Button>
    </form>
  );
}
