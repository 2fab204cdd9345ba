import { HAZARD_BASIS_LABELS, type ChemicalView } from '../../../../shared/schemas/reference';

type CautionChemical = Pick<ChemicalView, 'name' | 'status' | 'ghs'>;

const DEFER = "Defer to the supplier's safety data sheet, local rules and licensed practice.";

/** One line saying where this chemical's hazard data come from (its basis and source), or null when nothing is recorded. */
export function hazardSourceLine(ghs: ChemicalView['ghs']): string | null {
  const basis = ghs.basis ? HAZARD_BASIS_LABELS[ghs.basis] : null;
  if (!basis && !ghs.source) return null;
  return [basis, ghs.source].filter(Boolean).join(' — ');
}

/**
 * The safety caution shown wherever a chemical appears: the chemical's name, signal word, H statements
 * as a label shows them (H400 left off where H410 applies), PPE, one line naming where the hazard data
 * come from, and the deferral to the SDS. `modernUse` marks a modern trial step, where a historical-only
 * chemical gets a prominent warning instead of a quiet note.
 */
export function ChemicalCaution({
  chemical,
  modernUse = false,
  compact = false,
}: {
  chemical: CautionChemical;
  modernUse?: boolean;
  compact?: boolean;
}) {
  const { ghs, status } = chemical;
  const statements = ghs.labelStatements;
  const hazardous = ghs.signalWord !== null || ghs.hStatements.length > 0 || status !== 'permitted';
  const alarm = status === 'historical-only' && modernUse;
  const tone =
    alarm || ghs.signalWord === 'Danger'
      ? 'border-danger bg-danger-tint'
      : hazardous
        ? 'border-warn bg-warn-tint'
        : 'border-rule bg-paper';
  const source = hazardSourceLine(ghs);
  return (
    <aside
      aria-label={`Safety: ${chemical.name}`}
      role={alarm ? 'alert' : undefined}
      className={`rounded-md border-l-4 px-3 ${compact ? 'py-1.5 text-xs' : 'py-2 text-sm'} ${tone}`}
    >
      {alarm ? (
        <p className="font-semibold text-danger">
          {chemical.name} is for historical record only. Do not use it in a modern trial: choose a permitted substitute.
        </p>
      ) : null}
      <p>
        <span className="font-semibold text-ink">{chemical.name}: </span>
        <span
          className={`font-semibold ${ghs.signalWord === 'Danger' ? 'text-danger' : ghs.signalWord === 'Warning' ? 'text-warn' : 'text-ink-soft'}`}
        >
          {ghs.signalWord ?? 'No GHS signal word'}
        </span>
        {ghs.caution ? <span className="text-ink"> — {ghs.caution}</span> : null}
      </p>
      {statements.length > 0 ? (
        <ul className="mt-1 list-none space-y-0.5" aria-label={`Hazard statements: ${chemical.name}`}>
          {statements.map((h) => (
            <li key={h}>{h}</li>
          ))}
        </ul>
      ) : null}
      {ghs.ppe ? (
        <p className="mt-1">
          <span className="font-medium">Protection:</span> {ghs.ppe}
        </p>
      ) : null}
      <p className="mt-1 text-ink-soft">{DEFER}</p>
      {source ? (
        <p className="mt-0.5 text-ink-faint" data-testid="hazard-source">
          Hazard data for {chemical.name}: {source}
        </p>
      ) : null}
    </aside>
  );
}
