import { useId, useState } from 'react';
import {
  ANALYSIS_METHODS,
  CONFIDENCES,
  CONFIDENCE_WORDS,
  analysisCreateSchema,
} from '../../../../shared/schemas/records';
import { COLORANTS, ELEMENTS } from '../../../../shared/data/marker-compounds';
import { formatBytes } from '../../../../shared/format';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { CheckboxGroup } from '../../../components/form/CheckboxGroup';
import { FormAlert } from '../../../components/form/FormAlert';
import { Select } from '../../../components/form/Select';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useAnalyses, useCreateAnalysis, type Analysis } from '../api';

type Term = { name: string; evidence: string; analysisId?: number | null };
type Confidence = (typeof CONFIDENCES)[number];
const today = () => new Date().toISOString().slice(0, 10);

/** A piece's analyses, newest first: method, site, laboratory, findings, what they suggest, the report; and the form. */
export function AnalysesPanel({
  pieceId,
  terms,
  regions,
}: {
  pieceId: number;
  /** The piece's dyestuffs and mordants, which an analysis may mark identified. */
  terms: Term[];
  regions: Array<{ id: number; label: string }>;
}) {
  const analyses = useAnalyses(pieceId);
  const [open, setOpen] = useState(false);
  const items = analyses.data?.items ?? [];
  return (
    <section className="space-y-4" aria-labelledby="analyses-h">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="analyses-h" className="font-serif text-2xl">
          Analyses
        </h2>
        {analyses.data?.canCreate && !open ? (
          <Button variant="secondary" onClick={() => setOpen(true)}>
            Record an analysis
          </Button>
        ) : null}
      </div>
      {open ? <AnalysisForm pieceId={pieceId} terms={terms} regions={regions} onDone={() => setOpen(false)} /> : null}
      {analyses.isPending ? <p className="text-sm text-ink-soft">Loading…</p> : null}
      {analyses.data && !items.length ? <p className="text-sm text-ink-soft">No analyses recorded.</p> : null}
      <ul className="space-y-4">
        {items.map((a) => (
          <AnalysisCard key={a.id} analysis={a} terms={terms} regions={regions} />
        ))}
      </ul>
    </section>
  );
}

function AnalysisCard({
  analysis: a,
  terms,
  regions,
}: {
  analysis: Analysis;
  terms: Term[];
  regions: Array<{ id: number; label: string }>;
}) {
  const backs = terms.filter((t) => t.evidence === 'identified' && t.analysisId === a.id).map((t) => t.name);
  const region = regions.find((r) => r.id === a.regionId);
  return (
    <li id={`analysis-${a.id}`} tabIndex={-1} className="rounded-md border border-rule bg-sheet p-4 target:ring-2">
      <h3 className="font-medium">
        {a.method} <span className="num text-ink-soft">· {a.analysedOn}</span>
      </h3>
      <p className="text-sm text-ink-soft break-words">
        {[region ? `Region: ${region.label}` : null, a.site, a.laboratory, a.analyst].filter(Boolean).join(' · ')}
      </p>
      {backs.length ? (
        <p className="mt-1 text-sm">
          The record behind: <strong>{backs.map((n) => `${n} (identified)`).join(', ')}</strong>
        </p>
      ) : null}
      {a.findings.length ? (
        <div className="mt-2 overflow-x-auto">
          <table className="text-sm">
            <caption className="sr-only">Findings of the {a.method} analysis</caption>
            <thead>
              <tr>
                <th scope="col" className="pr-6 text-left font-medium">
                  Colorant or element
                </th>
                <th scope="col" className="text-left font-medium">
                  Confidence
                </th>
              </tr>
            </thead>
            <tbody>
              {a.findings.map((f) => (
                <tr key={f.substance}>
                  <td className="pr-6">{f.substance}</td>
                  <td>{CONFIDENCE_WORDS[f.confidence]}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {a.suggests.length ? (
        <p className="mt-2 text-sm">
          Suggests: {a.suggests.map((s) => `${s.name} (${s.confidence}, from ${s.markers.join(', ')})`).join('; ')}
        </p>
      ) : null}
      {a.notes ? <p className="mt-2 whitespace-pre-line text-sm">{a.notes}</p> : null}
      {a.report ? (
        <p className="mt-2 text-sm">
          {a.report.url ? (
            <a className="text-action hover:underline" href={a.report.url}>
              Report (PDF, {formatBytes(a.report.bytes)})
            </a>
          ) : (
            `Report on file (PDF, ${formatBytes(a.report.bytes)})`
          )}{' '}
          <span className="break-all font-mono text-xs text-ink-faint">SHA-256 {a.report.sha256}</span>
        </p>
      ) : null}
    </li>
  );
}

type Row = { substance: string; confidence: Confidence | '' };

function AnalysisForm({
  pieceId,
  terms,
  regions,
  onDone,
}: {
  pieceId: number;
  terms: Term[];
  regions: Array<{ id: number; label: string }>;
  onDone: () => void;
}) {
  const create = useCreateAnalysis(pieceId);
  const { formRef, errors, check, fromServer } = useFormErrors();
  const listId = useId();
  const [method, setMethod] = useState('');
  const [analysedOn, setAnalysedOn] = useState(today());
  const [regionId, setRegionId] = useState('');
  const [site, setSite] = useState('');
  const [laboratory, setLaboratory] = useState('');
  const [analyst, setAnalyst] = useState('');
  const [notes, setNotes] = useState('');
  const [rows, setRows] = useState<Row[]>([{ substance: '', confidence: '' }]);
  const [identifies, setIdentifies] = useState<string[]>([]);
  const [report, setReport] = useState<File | null>(null);
  const setRow = (i: number, patch: Partial<Row>) => setRows(rows.map((r, j) => (j === i ? { ...r, ...patch } : r)));

  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const input = check(analysisCreateSchema, {
      method: method || undefined,
      analysedOn: analysedOn || undefined,
      regionId: regionId ? Number(regionId) : null,
      site: site || null,
      laboratory: laboratory || null,
      analyst: analyst || null,
      notes: notes || null,
      // An empty last row is left out; a half-filled one is checked.
      findings: rows
        .filter((r) => r.substance.trim() || r.confidence)
        .map((r) => ({ substance: r.substance, confidence: r.confidence || undefined })),
      identifies,
    });
    if (!input) return;
    create.mutate({ input, report }, { onSuccess: onDone, onError: fromServer });
  };

  return (
    <form ref={formRef} onSubmit={submit} noValidate className="space-y-4 rounded-md border border-rule p-4">
      <h3 className="font-medium">New analysis</h3>
      <div className="grid gap-4 sm:grid-cols-2">
        <Select
          label="Method"
          value={method}
          onChange={(e) => setMethod(e.target.value)}
          error={errors.method}
          options={[{ value: '', label: 'Choose…' }, ...ANALYSIS_METHODS.map((m) => ({ value: m, label: m }))]}
        />
        <Field
          label="Date analysed"
          type="date"
          value={analysedOn}
          onChange={(e) => setAnalysedOn(e.target.value)}
          error={errors.analysedOn}
        />
        {regions.length ? (
          <Select
            label="Sample site: region of a photo"
            value={regionId}
            onChange={(e) => setRegionId(e.target.value)}
            error={errors.regionId}
            options={[
              { value: '', label: 'None (described below)' },
              ...regions.map((r) => ({ value: String(r.id), label: r.label })),
            ]}
          />
        ) : null}
        <Field
          label="Sample or site, described"
          value={site}
          onChange={(e) => setSite(e.target.value)}
          error={errors.site}
          hint="e.g. loose warp thread, red ground, lower left"
        />
        <Field
          label="Laboratory"
          value={laboratory}
          onChange={(e) => setLaboratory(e.target.value)}
          error={errors.laboratory}
        />
        <Field label="Analyst" value={analyst} onChange={(e) => setAnalyst(e.target.value)} error={errors.analyst} />
      </div>
      <fieldset>
        <legend className="text-sm font-medium">Findings</legend>
        <datalist id={listId}>
          {[...COLORANTS, ...ELEMENTS].map((s) => (
            <option key={s} value={s} />
          ))}
        </datalist>
        <ul className="mt-1 space-y-2">
          {rows.map((r, i) => (
            <li key={i} className="flex flex-wrap items-start gap-2">
              <Field
                className="min-w-40 flex-1"
                label={`Colorant or element ${i + 1}`}
                list={listId}
                value={r.substance}
                onChange={(e) => setRow(i, { substance: e.target.value })}
                error={errors[`findings.${i}.substance`]}
              />
              <Select
                label={`Confidence ${i + 1}`}
                value={r.confidence}
                onChange={(e) => setRow(i, { confidence: e.target.value as Confidence })}
                error={errors[`findings.${i}.confidence`]}
                options={[
                  { value: '', label: 'Choose…' },
                  ...CONFIDENCES.map((c) => ({ value: c, label: CONFIDENCE_WORDS[c] })),
                ]}
              />
              <button
                type="button"
                className="self-end px-2 py-2 text-sm text-action hover:underline"
                onClick={() => setRows(rows.filter((_, j) => j !== i))}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
        <button
          type="button"
          className="mt-2 text-sm text-action hover:underline"
          onClick={() => setRows([...rows, { substance: '', confidence: '' }])}
        >
          Add a finding
        </button>
        {errors.findings ? (
          <p className="mt-1 text-sm text-danger" data-field-error tabIndex={-1}>
            {errors.findings.join(' ')}
          </p>
        ) : null}
      </fieldset>
      {terms.length ? (
        <CheckboxGroup
          legend="This analysis identifies"
          hint="Ticked entries of the piece become “identified” and point to this analysis."
          options={terms.map((t) => ({ value: t.name, label: t.name }))}
          selected={identifies}
          onChange={setIdentifies}
          error={errors.identifies}
        />
      ) : null}
      <Field
        label="Report (PDF)"
        type="file"
        accept="application/pdf,.pdf"
        onChange={(e) => setReport(e.target.files?.[0] ?? null)}
        error={errors.report}
        hint="Kept as sent, with its SHA-256; only the team can open it."
      />
      <label className="block text-sm">
        <span className="font-medium">Notes</span>
        <textarea
          value={notes}
          onChange={(e) => setNotes(e.target.value)}
          rows={3}
          className="mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 text-sm"
        />
      </label>
      <FormAlert message={formMessage(create.error)} />
      <div className="flex gap-2">
        <Button type="submit" disabled={create.isPending}>
          Save analysis
        </Button>
        <Button type="button" variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
