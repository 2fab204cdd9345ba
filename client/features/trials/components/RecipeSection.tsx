import { useMemo, useState } from 'react';
import { basisLabels, operationLabels } from '../../../../shared/schemas/trial';
import { drawWarnings, scaleDraw } from '../../../../shared/trials/draws';
import { computeStep, scaleSteps, type StepComputed } from '../../../../shared/trials/quantities';
import { ChemicalCaution } from '../../reference';
import { useChemicals } from '../../reference';
import type { TrialView } from '../api';
import { fmt } from '../format';
import { formatDateTime } from '../../../../shared/format';

type Step = TrialView['steps'][number];
type MordantCheck = TrialView['checks']['mordant'][number];

const VERDICT_WORDS: Record<MordantCheck['verdict'], string> = {
  below: 'below the usual range',
  within: 'within the usual range',
  above: 'above the usual range',
  'no-range': 'no usual range recorded for this fibre',
  'not-computed': 'not computed',
};

/** An aluminium mordant or tannin beside the range commonly used on the trial's fibre, and the Al it puts on each kg. */
function MordantRange({ c }: { c: MordantCheck }) {
  return (
    <p
      className={`text-xs ${c.verdict === 'below' || c.verdict === 'above' ? 'text-warn' : 'text-ink-soft'}`}
      data-testid="mordant-range"
    >
      {c.name}
      {c.percentOwf != null ? (
        <>
          {' '}
          <Qty value={c.percentOwf} unit="% owf" />
        </>
      ) : null}
      {c.range ? (
        <>
          {' '}
          · usual {fmt(c.range.low, 0)}–{fmt(c.range.high, 0)} % owf for {c.range.applies}
        </>
      ) : null}{' '}
      · {VERDICT_WORDS[c.verdict]}
      {c.gAlPerKg != null ? (
        <>
          {' '}
          · <Qty value={c.gAlPerKg} unit="g Al/kg fibre" decimals={2} />
          {c.rangeGAlPerKg ? (
            <>
              {' '}
              (usual {fmt(c.rangeGAlPerKg[0], 1)}–{fmt(c.rangeGAlPerKg[1], 1)})
            </>
          ) : null}
        </>
      ) : null}
      <span className="ml-1 italic text-ink-faint">— {c.marking}</span>
    </p>
  );
}

const Qty = ({ value, unit, decimals = 1 }: { value: number | null | undefined; unit: string; decimals?: number }) =>
  value == null ? (
    <span className="text-ink-faint">—</span>
  ) : (
    <span className="font-mono whitespace-nowrap">
      {fmt(value, decimals)} {unit}
    </span>
  );

function PasteMakeUp({ c }: { c: StepComputed }) {
  if (c.pasteProblem) return <p className="text-sm text-danger">Paste: {c.pasteProblem}</p>;
  if (!c.paste) return null;
  const p = c.paste;
  return (
    <div className="mt-2 rounded border border-rule bg-paper p-2 text-sm">
      <p className="font-medium">
        Paste make-up for <Qty value={p.finalVolumeMl} unit="mL" decimals={0} />
      </p>
      <ul className="mt-1 space-y-0.5">
        {p.mordants.map((m) => (
          <li key={m.name}>
            {m.name}: <Qty value={m.gPerL} unit="g/L" /> → <Qty value={m.grams} unit="g" decimals={2} />
            {m.stockMl != null ? (
              <>
                {' '}
                , from stock: <Qty value={m.stockMl} unit="mL" decimals={0} />
              </>
            ) : null}
          </li>
        ))}
        {p.thickener ? (
          <li>
            {p.thickener.name}: <Qty value={p.thickener.gPerL} unit="g/L" /> →{' '}
            <Qty value={p.thickener.grams} unit="g" decimals={2} />
            {p.thickener.outsideUsualRange && p.thickener.usualRange ? (
              <span className="ml-2 text-warn">
                outside the usual {p.thickener.usualRange.min}–{p.thickener.usualRange.max} g/L for{' '}
                {p.thickener.usualRange.label} ({p.thickener.usualRange.source})
              </span>
            ) : null}
          </li>
        ) : null}
        <li>
          Water to make up: <Qty value={p.waterMl} unit="mL" decimals={0} />
        </li>
      </ul>
    </div>
  );
}

// Below md the table reflows into one stacked card per step (same markup, so the cautions stay in one place):
// rows and cells become blocks, the header hides and each quantity carries its own label.
const QTY_CELL =
  'px-3 py-1.5 text-right max-md:p-0 max-md:text-left max-md:before:mr-1 max-md:before:text-xs max-md:before:text-ink-faint max-md:before:content-[attr(data-label)]';

function StepRow({
  step,
  computed,
  modern,
  mordant,
}: {
  step: Step;
  computed: StepComputed;
  modern: boolean;
  mordant: MordantCheck[];
}) {
  return (
    <tbody className="border-t border-rule align-top max-md:block max-md:py-2" data-testid="recipe-step">
      <tr className="max-md:flex max-md:items-baseline max-md:gap-2 max-md:px-3">
        <td className="px-3 py-2 font-mono max-md:p-0" rowSpan={Math.max(1, step.ingredients.length) + 1}>
          {step.position}
        </td>
        <td
          className="px-3 py-2 font-medium max-md:p-0 max-md:flex-1"
          rowSpan={Math.max(1, step.ingredients.length) + 1}
        >
          {operationLabels[step.operation as keyof typeof operationLabels]}
          <div className="mt-1 text-xs font-normal text-ink-soft space-y-0.5">
            {step.liquorRatio != null ? <div>liquor 1:{step.liquorRatio}</div> : null}
            {computed.volumeL != null ? (
              <div>
                {step.paste ? 'paste' : 'water'} <Qty value={computed.volumeL} unit="L" decimals={2} />
              </div>
            ) : null}
            {step.temperatureC != null ? (
              <div>
                <Qty value={step.temperatureC} unit="°C" decimals={0} />
              </div>
            ) : null}
            {step.minutes != null ? (
              <div>
                <Qty value={step.minutes} unit="min" decimals={0} />
              </div>
            ) : null}
            {step.ph != null ? (
              <div>
                pH <span className="font-mono">{fmt(step.ph, 1)}</span>
              </div>
            ) : null}
            {step.batchVolumeMl != null ? (
              <div>
                drawn from{' '}
                {step.batch ? <span className="font-mono">{step.batch.code}</span> : `batch #${step.batchId}`}:{' '}
                <Qty value={step.batchVolumeMl} unit="mL" decimals={0} />
              </div>
            ) : null}
          </div>
        </td>
      </tr>
      {step.ingredients.map((ing, i) => (
        <tr
          key={`${ing.kind}-${ing.refId}-${i}`}
          className="max-md:mt-2 max-md:grid max-md:grid-cols-2 max-md:gap-x-3 max-md:gap-y-0.5 max-md:px-3"
        >
          <td className="px-3 py-1.5 max-md:col-span-2 max-md:p-0">
            {ing.name}
            <span className="ml-1 text-xs text-ink-faint">{ing.kind}</span>
          </td>
          <td className={QTY_CELL} data-label="Amount">
            <Qty
              value={ing.amount}
              unit={basisLabels[ing.basis as keyof typeof basisLabels]}
              decimals={ing.basis === 'g' ? 2 : 1}
            />
          </td>
          <td className={QTY_CELL} data-label="Grams">
            <Qty value={computed.ingredients[i]?.grams} unit="g" decimals={2} />
          </td>
          <td className={QTY_CELL} data-label={step.operation === 'print-paste' ? 'Paste' : 'Bath'}>
            <Qty
              value={computed.ingredients[i]?.gPerL}
              unit={step.operation === 'print-paste' ? 'g/L of paste' : 'g/L'}
              decimals={2}
            />
          </td>
          <td className={QTY_CELL} data-label="On fibre">
            <Qty value={computed.ingredients[i]?.percentOwf} unit="% owf" />
          </td>
        </tr>
      ))}
      {step.notes ||
      step.cautions.length ||
      step.warnings.length ||
      step.historicalUse ||
      mordant.length ||
      computed.paste ||
      computed.pasteProblem ||
      computed.missing.some(Boolean) ? (
        <tr className="max-md:mt-2 max-md:block max-md:px-3">
          <td className="max-md:hidden" />
          <td colSpan={6} className="px-3 pb-3 space-y-2 max-md:block max-md:p-0">
            {step.warnings.map((w, k) => (
              <div
                key={k}
                role="alert"
                className="rounded-md border-2 border-danger bg-danger-tint px-3 py-2 text-sm text-danger"
              >
                <p className="font-semibold">⚠ {w.message}</p>
                {w.code === 'incompatible-mix' ? (
                  <p className="mt-0.5 text-xs font-normal">Source: {w.source}.</p>
                ) : null}
              </div>
            ))}
            {step.historicalUse ? (
              <p className="text-sm text-ink-soft" data-testid="historical-use">
                Historical-only use confirmed by {step.historicalUse.confirmedBy?.name ?? 'a former user'} on{' '}
                {formatDateTime(step.historicalUse.confirmedAt)}: “{step.historicalUse.reason}”
              </p>
            ) : null}
            {mordant.map((c, k) => (
              <MordantRange key={k} c={c} />
            ))}
            {computed.missing.filter(Boolean).map((m, i) => (
              <p key={i} className="text-xs text-warn">
                {m}
              </p>
            ))}
            <PasteMakeUp c={computed} />
            {step.notes ? <p className="text-sm text-ink-soft">{step.notes}</p> : null}
            {step.cautions.map((c) => (
              <ChemicalCaution key={c.id} chemical={c} modernUse={modern} compact />
            ))}
          </td>
        </tr>
      ) : null}
    </tbody>
  );
}

/** The ordered recipe with every computed quantity, and scaling to another dry mass in one step. */
export function RecipeSection({ trial }: { trial: TrialView }) {
  const [scaleTo, setScaleTo] = useState('');
  const chemicals = useChemicals();
  const target = Number(scaleTo);
  // Every % owf is of the air-dry (commercial) mass; an oven-dry mass was brought to it on the server.
  const base = trial.mass.recipeMassG;
  const scaling = scaleTo.trim() !== '' && target > 0 && target !== base;
  const roles = useMemo(
    () => new Map((chemicals.data?.items ?? []).map((c) => [c.id, c.role as string])),
    [chemicals.data],
  );
  const rows = useMemo(() => {
    if (!scaling) return trial.steps.map((s) => ({ step: s, computed: s.computed }));
    return scaleSteps(trial.steps, base, target).map((s) => ({
      step: { ...s, batchVolumeMl: scaleDraw(s.batchVolumeMl, base, target) },
      computed: computeStep(s, target, roles),
    }));
  }, [scaling, trial, base, target, roles]);
  const drawsShort = scaling ? drawWarnings(trial.steps, base, target) : [];
  const m = trial.mass;

  return (
    <section aria-labelledby="recipe-h" className="space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id="recipe-h" className="text-xl font-semibold">
          Recipe
        </h2>
        <label className="text-sm">
          Scale to dry mass <span className="text-ink-faint">(g, air-dry)</span>
          <input
            className="ml-2 w-28 rounded-md border border-rule-strong bg-sheet px-2 py-1 font-mono"
            inputMode="decimal"
            value={scaleTo}
            placeholder={fmt(base, 1)}
            onChange={(e) => setScaleTo(e.target.value)}
            aria-describedby="scale-note"
          />
        </label>
      </div>
      <p id="scale-note" className="text-xs text-ink-faint">
        {scaling ? (
          <>
            Showing the recipe for <span className="font-mono">{fmt(target, 1)} g</span> air-dry fibre (recorded for{' '}
            <span className="font-mono">{fmt(base, 1)} g</span>): % owf, g/L and the liquor ratio stay; fixed grams,
            paste volumes and bath draws scale by mass.
          </>
        ) : (
          <>
            For <span className="font-mono">{fmt(base, 1)} g</span> air-dry fibre
            {m.basis === 'oven-dry' && m.regainPct != null ? (
              <>
                {' '}
                (<span className="font-mono">{fmt(m.enteredG, 1)} g</span> oven-dry × (1 + {fmt(m.regainPct, 2)} %
                regain for {m.fibre}; {m.source})
              </>
            ) : null}
            . Grams = % owf ÷ 100 × air-dry mass; water = fibre kg × n for 1:n; g/L = 10 × % owf ÷ n (common practice).
          </>
        )}
      </p>
      {m.problem ? <p className="text-xs text-warn">{m.problem}</p> : null}
      {trial.checks.warnings
        .filter((w) => w.code === 'cellulose-alum-without-fixing')
        .map((w, k) => (
          <p key={k} role="alert" className="rounded-md border border-warn bg-paper px-3 py-2 text-sm text-warn">
            Step {w.stepPosition}: {w.message} <span className="italic">({w.marking})</span>
          </p>
        ))}
      {drawsShort.map((w) => (
        <p key={w.batchId} role="alert" className="rounded-md border border-warn bg-paper px-3 py-2 text-sm text-warn">
          {w.message}
        </p>
      ))}
      {trial.steps.length === 0 ? (
        <p className="text-ink-soft">No steps yet.</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-rule bg-sheet">
          <table className="w-full text-sm max-md:block">
            <thead className="bg-paper text-left text-ink-soft max-md:hidden">
              <tr>
                <th className="px-3 py-2">#</th>
                <th className="px-3 py-2">Step</th>
                <th className="px-3 py-2">Ingredient</th>
                <th className="px-3 py-2 text-right">Amount</th>
                <th className="px-3 py-2 text-right">Grams</th>
                <th className="px-3 py-2 text-right">Bath</th>
                <th className="px-3 py-2 text-right">On fibre</th>
              </tr>
            </thead>
            {rows.map(({ step, computed }) => (
              <StepRow
                key={step.id}
                step={step}
                computed={computed}
                modern={trial.kind === 'modern'}
                mordant={trial.checks.mordant.filter((c) => c.stepPosition === step.position)}
              />
            ))}
          </table>
        </div>
      )}
    </section>
  );
}
