import { useState, type FormEvent } from 'react';
import { EDTF_HINT, edtfYears, parseEdtf } from '../../../../shared/edtf';
import { pieceCreateSchema, type PieceCreateInput } from '../../../../shared/schemas/piece';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { useFormErrors } from '../../../lib/form';
import { useVocabularies } from '../../vocabularies';
import { usePieceAnalysisChoices, type Piece } from '../api';
import { EvidencedList, TermChecklist, TextAreaField, type Evidenced } from './FormBits';
import { CuratorialFieldset, type CuratorialText, type MakerRow, type MarkRow } from './CuratorialFields';

type Text = Record<
  | 'accessionNumber'
  | 'objectName'
  | 'title'
  | 'dateText'
  | 'dateEdtf'
  | 'earliestYear'
  | 'latestYear'
  | 'place'
  | 'weave'
  | 'threadCount'
  | 'heightMm'
  | 'widthMm'
  | 'repeatMm'
  | 'description'
  | 'provenance'
  | 'condition'
  | 'creditLine'
  | keyof CuratorialText,
  string
>;
type State = Text & {
  fibres: string[];
  techniques: string[];
  dyestuffs: Evidenced[];
  historicalMordants: Evidenced[];
  makers: MakerRow[];
  marks: MarkRow[];
};

const NUMERIC = new Set(['earliestYear', 'latestYear', 'heightMm', 'widthMm', 'repeatMm']);
const str = (v: unknown) => (v == null ? '' : String(v));

function initial(p?: Piece): State {
  const keys = [
    'accessionNumber',
    'objectName',
    'title',
    'dateText',
    'dateEdtf',
    'earliestYear',
    'latestYear',
    'place',
    'weave',
    'threadCount',
    'heightMm',
    'widthMm',
    'repeatMm',
    'description',
    'provenance',
    'condition',
    'creditLine',
    'patternName',
    'storageLocation',
    'objectRights',
    'imageRights',
  ] as const;
  const text = Object.fromEntries(keys.map((k) => [k, str(p?.[k])])) as Text;
  return {
    ...text,
    fibres: p?.fibres ?? [],
    techniques: p?.techniques ?? [],
    dyestuffs: p?.dyestuffs ?? [],
    historicalMordants: p?.historicalMordants ?? [],
    makers: (p?.makers ?? []).map((m) => ({ ...m, dates: m.dates ?? '' })),
    marks: (p?.marks ?? []).map((m) => ({ ...m, place: m.place ?? '' })),
  };
}

// Required fields stay text when empty, so the schema answers "Enter a title" rather than a type error.
const REQUIRED = new Set(['accessionNumber', 'objectName', 'title']);

/** Form text → the shared schema's input: empty optional text is null, numbers are numbers. */
function toInput(s: State): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(s)) {
    if (Array.isArray(v)) out[k] = v;
    // Text that is not a number goes as typed, so the message says a number is wanted.
    else if (NUMERIC.has(k)) out[k] = v.trim() === '' ? null : Number.isFinite(Number(v)) ? Number(v) : v;
    else out[k] = v.trim() === '' && !REQUIRED.has(k) ? null : v.trim();
  }
  return out;
}

export function PieceForm({
  piece,
  submitLabel,
  onSubmit,
}: {
  piece?: Piece;
  submitLabel: string;
  onSubmit: (input: PieceCreateInput) => Promise<unknown>;
}) {
  const vocab = useVocabularies().data;
  const analyses = usePieceAnalysisChoices(piece?.id).data ?? [];
  const [state, setState] = useState<State>(() => initial(piece));
  const { formRef, errors, check, fromServer } = useFormErrors();
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const set = <K extends keyof State>(k: K, v: State[K]) => setState((s) => ({ ...s, [k]: v }));
  const text = (k: keyof Text) => ({
    value: state[k],
    onChange: (e: { target: { value: string } }) => set(k, e.target.value),
    error: errors[k],
  });
  // The EDTF date is read as it is typed (shared/edtf.ts, the same reader as the server); what is wrong shows once the
  // field is left, and the year fields say how far an approximate or uncertain date may reach.
  const [edtfLeft, setEdtfLeft] = useState(false);
  const edtf = state.dateEdtf.trim() ? parseEdtf(state.dateEdtf) : null;
  const edtfProblem = edtfLeft && edtf && !edtf.ok ? edtf.message : undefined;
  const years = edtf?.ok ? edtf.value : null;
  const yearHint = (qualified: boolean | undefined, way: 'earlier' | 'later') =>
    qualified
      ? `Approximate or uncertain: may reach ${way} than the date, e.g. 1755–1765 for 1760~`
      : 'Filled from the EDTF date when left empty';
  // Years that merely echoed the old EDTF date follow a new one instead of contradicting it.
  const setEdtf = (value: string) =>
    setState((s) => {
      const old = s.dateEdtf ? edtfYears(s.dateEdtf) : null;
      const echo = (y: string, v: number | null | undefined) => (y !== '' && old && String(v) === y ? '' : y);
      return {
        ...s,
        dateEdtf: value,
        earliestYear: echo(s.earliestYear, old?.earliest),
        latestYear: echo(s.latestYear, old?.latest),
      };
    });

  async function submit(e: FormEvent) {
    e.preventDefault();
    setFormError(null);
    const data = check(pieceCreateSchema, toInput(state));
    if (!data) {
      setFormError('Some fields need attention; see the messages beside them.');
      return;
    }
    setBusy(true);
    try {
      await onSubmit(data);
    } catch (err) {
      fromServer(err);
      setFormError(err instanceof Error ? err.message : 'Saving failed.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <form ref={formRef} onSubmit={submit} noValidate className="space-y-8 max-w-4xl">
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-semibold font-serif">Identification</legend>
        <Field
          label="Accession number"
          hint="As your institution writes it, e.g. 1931.4.12, 1931.4.12a-b, T.14-1950 or EX 2021/1"
          className="font-mono"
          {...text('accessionNumber')}
        />
        <Field label="Object name" hint="e.g. furnishing fabric, panel, dress fabric" {...text('objectName')} />
        <Field label="Title" className="sm:col-span-2" {...text('title')} />
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="mb-2 text-lg font-semibold font-serif">Date and place</legend>
        <Field label="Date as written" hint="e.g. about 1770–1785" className="lg:col-span-2" {...text('dateText')} />
        <Field
          label="Date (EDTF)"
          hint={EDTF_HINT}
          className="lg:col-span-2 font-mono"
          {...text('dateEdtf')}
          error={errors.dateEdtf ?? edtfProblem}
          onChange={(e) => setEdtf(e.target.value)}
          onBlur={() => setEdtfLeft(true)}
        />
        <Field
          label="Earliest year"
          inputMode="numeric"
          placeholder={years?.earliest != null ? String(years.earliest) : ''}
          hint={yearHint(years?.startQualified, 'earlier')}
          {...text('earliestYear')}
        />
        <Field
          label="Latest year"
          inputMode="numeric"
          placeholder={years?.latest != null ? String(years.latest) : ''}
          hint={years?.endQualified ? yearHint(true, 'later') : undefined}
          {...text('latestYear')}
        />
        <Field label="Place" className="lg:col-span-2" {...text('place')} />
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="mb-2 text-lg font-semibold font-serif">Cloth</legend>
        <div className="sm:col-span-2 lg:col-span-4">
          <TermChecklist
            legend="Fibres"
            terms={vocab?.fibres.map((t) => t.term) ?? []}
            value={state.fibres}
            onChange={(v) => set('fibres', v)}
            error={errors.fibres}
          />
        </div>
        <Field label="Weave" list="weave-terms" {...text('weave')} />
        <datalist id="weave-terms">
          {vocab?.weaves.map((t) => (
            <option key={t.term} value={t.term} />
          ))}
        </datalist>
        <Field label="Thread count" hint="e.g. 24 × 22 threads/cm" {...text('threadCount')} />
        <Field label="Height" unit="mm" inputMode="decimal" {...text('heightMm')} />
        <Field label="Width" unit="mm" inputMode="decimal" {...text('widthMm')} />
        <Field label="Pattern repeat" unit="mm" inputMode="decimal" {...text('repeatMm')} />
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="mb-2 text-lg font-semibold font-serif">Making</legend>
        <TermChecklist
          legend="Techniques"
          terms={vocab?.techniques.map((t) => t.term) ?? []}
          value={state.techniques}
          onChange={(v) => set('techniques', v)}
          error={errors.techniques}
        />
        <EvidencedList
          legend="Dyestuffs"
          field="dyestuffs"
          suggestions={vocab?.dyestuffs.map((d) => d.name) ?? []}
          value={state.dyestuffs}
          analyses={analyses}
          onChange={(v) => set('dyestuffs', v)}
          errors={errors}
        />
        <EvidencedList
          legend="Historical mordants"
          field="historicalMordants"
          hint="What the maker used, for the record; several were toxic (lead, chromium, tin, arsenic). Trials record the safer substitutes."
          suggestions={vocab?.mordants.map((m) => m.name) ?? []}
          value={state.historicalMordants}
          analyses={analyses}
          onChange={(v) => set('historicalMordants', v)}
          errors={errors}
        />
      </fieldset>

      <fieldset className="grid gap-4">
        <legend className="mb-2 text-lg font-semibold font-serif">Record</legend>
        <TextAreaField label="Description" {...text('description')} />
        <TextAreaField label="Provenance" {...text('provenance')} />
        <TextAreaField label="Condition" {...text('condition')} />
        <Field label="Credit line" {...text('creditLine')} />
      </fieldset>

      <CuratorialFieldset
        makers={state.makers}
        marks={state.marks}
        text={state}
        onMakers={(v) => set('makers', v)}
        onMarks={(v) => set('marks', v)}
        onText={(k, v) => set(k, v)}
        errors={errors}
      />

      {formError ? (
        <p role="alert" className="rounded-md bg-danger-tint px-3 py-2 text-sm text-danger">
          {formError}
          {errors._ ? ` ${errors._.join(' ')}` : ''}
        </p>
      ) : null}
      <Button type="submit" disabled={busy}>
        {busy ? 'Saving…' : submitLabel}
      </Button>
    </form>
  );
}
