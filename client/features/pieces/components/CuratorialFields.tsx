import { useId } from 'react';
import { EDTF_HINT } from '../../../../shared/edtf';
import { RIGHTS_CHOICES } from '../../../../shared/rights';
import { MAKER_ROLES, MARK_KINDS } from '../../../../shared/schemas/curatorial';
import { Field } from '../../../components/form/Field';
import { Select } from '../../../components/form/Select';
import { errorText } from './FormBits';

export type MakerRow = { name: string; role: (typeof MAKER_ROLES)[number]; dates: string };
export type MarkRow = { text: string; kind: (typeof MARK_KINDS)[number]; place: string };
export type CuratorialText = {
  patternName: string;
  storageLocation: string;
  objectRights: string;
  imageRights: string;
};

const options = (list: readonly string[]) => list.map((v) => ({ value: v, label: v }));

/** Makers (with role and EDTF dates), pattern name, marks and inscriptions, storage and rights: issue 19's fields. */
export function CuratorialFieldset({
  makers,
  marks,
  text,
  onMakers,
  onMarks,
  onText,
  errors,
}: {
  makers: MakerRow[];
  marks: MarkRow[];
  text: CuratorialText;
  onMakers: (v: MakerRow[]) => void;
  onMarks: (v: MarkRow[]) => void;
  onText: (k: keyof CuratorialText, v: string) => void;
  errors: Record<string, string[]>;
}) {
  const rightsList = useId();
  const setMaker = (i: number, patch: Partial<MakerRow>) =>
    onMakers(makers.map((m, j) => (j === i ? { ...m, ...patch } : m)));
  const setMark = (i: number, patch: Partial<MarkRow>) =>
    onMarks(marks.map((m, j) => (j === i ? { ...m, ...patch } : m)));
  const field = (k: keyof CuratorialText) => ({
    value: text[k],
    onChange: (e: { target: { value: string } }) => onText(k, e.target.value),
    error: errors[k],
  });
  return (
    <fieldset className="space-y-4" data-testid="curatorial-fields">
      <legend className="mb-2 text-lg font-semibold font-serif">Makers, marks and rights</legend>
      <Field
        label="Pattern name"
        hint="The name the pattern is known by, e.g. Pheasant and Pomegranate"
        {...field('patternName')}
      />

      <fieldset>
        <legend className="text-sm font-medium">Makers</legend>
        <ul className="mt-1 space-y-3">
          {makers.map((m, i) => (
            <li key={i} className="grid gap-2 sm:grid-cols-[2fr_1fr_1fr_auto] items-start">
              <Field
                label={`Maker ${i + 1}`}
                value={m.name}
                onChange={(e) => setMaker(i, { name: e.target.value })}
                error={errors[`makers.${i}.name`]}
              />
              <Select
                label="Role"
                value={m.role}
                options={options(MAKER_ROLES)}
                onChange={(e) => setMaker(i, { role: e.target.value as MakerRow['role'] })}
                error={errors[`makers.${i}.role`]}
              />
              <Field
                label="Dates (EDTF)"
                className="font-mono"
                placeholder="1768/1791"
                value={m.dates}
                onChange={(e) => setMaker(i, { dates: e.target.value })}
                error={errors[`makers.${i}.dates`]}
              />
              <button
                type="button"
                className="sm:mt-6 px-2 py-2 text-sm text-action hover:underline justify-self-start"
                onClick={() => onMakers(makers.filter((_, j) => j !== i))}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
        <p className="mt-1 text-xs text-ink-faint">Dates as EDTF, {EDTF_HINT}</p>
        <button
          type="button"
          className="mt-1 text-sm text-action hover:underline"
          onClick={() => onMakers([...makers, { name: '', role: 'printer', dates: '' }])}
        >
          Add a maker
        </button>
        {errors.makers ? <p className="mt-1 text-sm text-danger">{errorText(errors.makers)}</p> : null}
      </fieldset>

      <fieldset>
        <legend className="text-sm font-medium">Marks and inscriptions</legend>
        <ul className="mt-1 space-y-3">
          {marks.map((m, i) => (
            <li key={i} className="grid gap-2 sm:grid-cols-[2fr_1fr_2fr_auto] items-start">
              <Field
                label={`Mark ${i + 1} text`}
                value={m.text}
                onChange={(e) => setMark(i, { text: e.target.value })}
                error={errors[`marks.${i}.text`]}
              />
              <Select
                label="Kind"
                value={m.kind}
                options={options(MARK_KINDS)}
                onChange={(e) => setMark(i, { kind: e.target.value as MarkRow['kind'] })}
                error={errors[`marks.${i}.kind`]}
              />
              <Field
                label="Where on the piece"
                placeholder="verso, lower left corner"
                value={m.place}
                onChange={(e) => setMark(i, { place: e.target.value })}
                error={errors[`marks.${i}.place`]}
              />
              <button
                type="button"
                className="sm:mt-6 px-2 py-2 text-sm text-action hover:underline justify-self-start"
                onClick={() => onMarks(marks.filter((_, j) => j !== i))}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
        <button
          type="button"
          className="mt-1 text-sm text-action hover:underline"
          onClick={() => onMarks([...marks, { text: '', kind: 'stamp', place: '' }])}
        >
          Add a mark
        </button>
        {errors.marks ? <p className="mt-1 text-sm text-danger">{errorText(errors.marks)}</p> : null}
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Storage location"
          hint="Seen by the team only: never shown to visitors, in IIIF or in Dublin Core"
          {...field('storageLocation')}
        />
        <span className="hidden sm:block" />
        <datalist id={rightsList}>
          {RIGHTS_CHOICES.map((c) => (
            <option key={c.uri} value={c.uri} label={c.label} />
          ))}
        </datalist>
        <Field
          label="Object rights"
          className="font-mono"
          list={rightsList}
          hint="A Creative Commons or RightsStatements.org URI"
          {...field('objectRights')}
        />
        <Field
          label="Image rights"
          className="font-mono"
          list={rightsList}
          hint="For the photographs; the IIIF manifest carries this one"
          {...field('imageRights')}
        />
      </div>
    </fieldset>
  );
}
