import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { labToHex } from '../../../../shared/colour';
import { conditionsText } from '../../../../shared/colour/conditions';
import { formatNumber } from '../../../../shared/format';
import { suggestionScaleSchema, type RecipeSuggestion } from '../../../../shared/schemas/suggestions';
import { basisLabels, operationLabels } from '../../../../shared/schemas/trial';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { Page } from '../../../components/Page';
import { ViewingConditions } from '../../../components/ViewingConditions';
import { formMessage, useFormErrors } from '../../../lib/form';
import { paths } from '../../../paths';
import { useCan } from '../../auth';
import { useRecipeSuggestions, useTrySuggestion, type SuggestionTarget } from '../api';

type Lab = { L: number; a: number; b: number };
const labText = (c: Lab) => `L* ${formatNumber(c.L)}  a* ${formatNumber(c.a)}  b* ${formatNumber(c.b)}`;
const TARGET_KEYS = ['paletteColourId', 'regionId', 'measurementId'] as const;
const CONFIDENCE_WORDS = { high: 'High confidence', medium: 'Medium confidence', low: 'Low confidence' } as const;
const METHOD_WORDS = {
  'as-dyed': 'as dyed',
  'kubelka-munk': 'Kubelka–Munk, from spectra',
  'lab-path': 'along measured L*a*b*',
} as const;

/** Read the target from the address: one id, or typed L*a*b*; anything else is ignored. */
function targetFrom(params: URLSearchParams): { target: SuggestionTarget; pieceId: number | null } {
  const num = (k: string) => {
    const v = params.get(k);
    return v != null && v.trim() !== '' && Number.isFinite(Number(v)) ? Number(v) : undefined;
  };
  const target: SuggestionTarget = {};
  for (const k of TARGET_KEYS) if (num(k) != null) target[k] = num(k);
  if (!Object.keys(target).length) for (const k of ['L', 'a', 'b'] as const) target[k] = num(k);
  return { target, pieceId: num('pieceId') ?? null };
}

function ColourBox({ colour, label }: { colour: Lab; label: string }) {
  return (
    <figure className="m-0">
      <div
        className="h-16 w-24 rounded border border-rule-strong"
        style={{ background: labToHex(colour) }}
        role="img"
        aria-label={`${label}: ${labText(colour)}`}
      />
      <figcaption className="mt-1 text-xs">
        <span className="font-medium text-ink">{label}</span>
        <span className="block font-mono text-ink-soft">{labText(colour)}</span>
      </figcaption>
    </figure>
  );
}

/** /suggest?paletteColourId=…&pieceId=…: recipes to try for a colour, ranked, explained, each with its expected error. */
export function SuggestionsPage() {
  const [params] = useSearchParams();
  const { target, pieceId } = targetFrom(params);
  const [dryMassG, setDryMassG] = useState(10);
  const [massText, setMassText] = useState('10');
  const { formRef, errors, check } = useFormErrors();
  const suggestions = useRecipeSuggestions({ ...target, dryMassG });
  const data = suggestions.data;

  return (
    <Page
      title="Recipes to try"
      lead="From the studio's own finished trials: the results nearest this colour, and ladders (trials that differ only in the strength of one dyestuff or mordant) interpolated to the strength that should give it. Modern recipes only."
    >
      <div className="mb-6 flex flex-wrap items-end gap-6 rounded-lg border border-rule bg-sheet p-4">
        {data ? (
          <div>
            <ColourBox colour={data.target} label="Target" />
            <p className="mt-1 text-xs text-ink-soft">
              {data.target.label} · <ViewingConditions colour={data.target} />
            </p>
          </div>
        ) : null}
        <form
          ref={formRef}
          noValidate
          className="flex flex-wrap items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            const v = check(suggestionScaleSchema, { dryMassG: massText.trim() === '' ? undefined : massText });
            if (v) setDryMassG(v.dryMassG);
          }}
        >
          <Field
            label="Dry fibre mass"
            unit="g"
            inputMode="decimal"
            value={massText}
            onChange={(e) => setMassText(e.target.value)}
            error={errors.dryMassG}
            className="w-40"
          />
          <Button type="submit" variant="secondary">
            Scale recipes
          </Button>
        </form>
        {data ? (
          <p className="text-xs text-ink-soft">
            Weighed {data.considered.trials} finished trial{data.considered.trials === 1 ? '' : 's'}, forming{' '}
            {data.considered.ladders} ladder{data.considered.ladders === 1 ? '' : 's'}.
          </p>
        ) : null}
      </div>

      <p className="mb-4 max-w-3xl rounded border border-warn bg-warn-tint p-3 text-sm" role="note">
        Before weighing anything, read each chemical&rsquo;s safety data sheet and follow local rules: mordants and
        alkalis can irritate skin and eyes, and spent baths need disposal as your local rules require. The{' '}
        <Link className="underline" to={paths.reference()}>
          reference page
        </Link>{' '}
        gives each chemical&rsquo;s hazards.
      </p>

      {suggestions.isPending ? <p className="text-ink-soft">Weighing the trials…</p> : null}
      <FormAlert message={suggestions.error ? formMessage(suggestions.error) : null} />
      {data && !data.items.length ? (
        <p className="text-ink-soft">
          No finished modern trial has a result to go on under {conditionsText(data.target)} yet. Finish a few trials
          with readings (a ladder of strengths works best) and come back.
        </p>
      ) : null}
      {data ? (
        <ol className="space-y-4">
          {data.items.map((s, i) => (
            <SuggestionCard
              key={`${s.source}-${s.basis.map((b) => b.id).join('-')}`}
              rank={i + 1}
              suggestion={s}
              target={target}
              conditions={data.target}
              pieceId={pieceId}
            />
          ))}
        </ol>
      ) : null}
    </Page>
  );
}

function SuggestionCard({
  rank,
  suggestion: s,
  target,
  conditions,
  pieceId,
}: {
  rank: number;
  suggestion: RecipeSuggestion;
  target: SuggestionTarget;
  conditions: { illuminant: string; observer: string };
  pieceId: number | null;
}) {
  const can = useCan();
  const navigate = useNavigate();
  const attempt = useTrySuggestion();
  const where = conditionsText(conditions);
  const expected = s.expectedError.deltaE00;
  const title =
    s.source === 'ladder' ? `Ladder of ${s.basis.length} trials` : `As trial ${s.basis[0]?.code ?? ''} was dyed`;
  const tryThis = () =>
    attempt.mutate(
      {
        pieceId,
        targetPaletteColourId: pieceId != null ? (target.paletteColourId ?? null) : null,
        targetRegionId: pieceId != null ? (target.regionId ?? null) : null,
        targetMeasurementId: pieceId != null ? (target.measurementId ?? null) : null,
        dryMassG: s.recipe.dryMassG,
        steps: s.recipe.steps.map((st) => ({
          operation: st.operation,
          liquorRatio: st.liquorRatio,
          temperatureC: st.temperatureC,
          minutes: st.minutes,
          ph: st.ph,
          notes: st.notes,
          ingredients: st.ingredients.map((g) => ({ kind: g.kind, refId: g.refId, amount: g.amount, basis: g.basis })),
        })),
        evidence: `${s.explanation} Predicted ΔE00 ${formatNumber(s.predicted.deltaE00)} under ${where}; expected error ${
          expected == null ? 'not estimated' : `ΔE00 ${formatNumber(expected)}`
        } (${s.expectedError.basis}). Basis: ${s.basis.map((b) => b.code).join(', ')}.`,
      },
      { onSuccess: ({ trial }) => navigate(paths.trial(trial.id)) },
    );

  return (
    <li className="rounded-lg border border-rule bg-sheet p-4" data-testid="recipe-suggestion">
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="font-serif text-lg">
          <span className="num text-ink-soft">{rank}.</span> {title}
        </h2>
        <span className="text-sm">
          {CONFIDENCE_WORDS[s.confidence]}
          {s.predicted.extrapolated ? ' · extrapolated' : ''}
        </span>
      </header>
      <div className="mt-3 flex flex-wrap items-start gap-6">
        <ColourBox colour={s.predicted.lab} label={`Predicted (${METHOD_WORDS[s.predicted.method]})`} />
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
          <dt className="text-ink-soft">From the target</dt>
          <dd className="num">
            ΔE00 {formatNumber(s.predicted.deltaE00)} <span className="text-xs text-ink-soft">under {where}</span>
          </dd>
          <dt className="text-ink-soft">Expected error</dt>
          <dd>
            <span className="num">{expected == null ? 'not estimated' : `ΔE00 ≈ ${formatNumber(expected)}`}</span>{' '}
            <span className="text-xs text-ink-soft">({s.expectedError.basis})</span>
          </dd>
          <dt className="text-ink-soft">Rests on</dt>
          <dd className="flex flex-wrap gap-x-2">
            {s.basis.map((b) => (
              <Link key={b.id} className="font-mono text-action hover:underline" to={paths.trial(b.id)}>
                {b.code}
                {b.strength != null ? ` (${formatNumber(b.strength)})` : ''}
              </Link>
            ))}
          </dd>
        </dl>
      </div>
      <p className="mt-3 max-w-3xl text-sm">{s.explanation}</p>
      <div className="mt-3 overflow-x-auto">
        <table className="min-w-full text-sm">
          <caption className="sr-only">Recipe for {s.recipe.dryMassG} g dry fibre</caption>
          <thead>
            <tr className="text-left text-ink-soft">
              <th className="pr-4 font-normal">Step</th>
              <th className="pr-4 font-normal">Ingredient</th>
              <th className="pr-4 text-right font-normal">Amount</th>
              <th className="pr-4 text-right font-normal">For {formatNumber(s.recipe.dryMassG, 0)} g fibre</th>
              <th className="font-normal">Bath</th>
            </tr>
          </thead>
          <tbody>
            {s.recipe.steps.flatMap((st, si) =>
              (st.ingredients.length ? st.ingredients : [null]).map((g, gi) => (
                <tr key={`${si}-${gi}`} className="border-t border-rule">
                  <td className="pr-4">{gi === 0 ? operationLabels[st.operation] : ''}</td>
                  <td className="pr-4">
                    {g ? g.name : '—'}
                    {g?.interpolated ? <span className="ml-1 text-xs text-ink-soft">(interpolated)</span> : null}
                  </td>
                  <td className="num pr-4 text-right">
                    {g ? `${formatNumber(g.amount)} ${basisLabels[g.basis]}` : ''}
                  </td>
                  <td className="num pr-4 text-right">{g?.grams != null ? `${formatNumber(g.grams, 2)} g` : '—'}</td>
                  <td className="text-xs text-ink-soft">
                    {gi === 0 && st.baths.length ? (
                      <span className="block">
                        Active bath{st.baths.length > 1 ? 's' : ''}:{' '}
                        {st.baths.map((b, bi) => (
                          <span key={b.id}>
                            {bi ? ', ' : ''}
                            <Link
                              className="font-mono text-action hover:underline"
                              to={paths.bath(b.id)}
                              title={b.name}
                            >
                              {b.code}
                            </Link>
                          </span>
                        ))}
                      </span>
                    ) : null}
                    {gi === 0
                      ? [
                          st.liquorRatio ? `1:${formatNumber(st.liquorRatio, 0)}` : null,
                          st.temperatureC != null ? `${formatNumber(st.temperatureC, 0)} °C` : null,
                          st.minutes != null ? `${formatNumber(st.minutes, 0)} min` : null,
                          st.ph != null ? `pH ${formatNumber(st.ph)}` : null,
                        ]
                          .filter(Boolean)
                          .join(' · ')
                      : ''}
                  </td>
                </tr>
              )),
            )}
          </tbody>
        </table>
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        {can('trial:create') ? (
          <Button type="button" onClick={tryThis} disabled={attempt.isPending}>
            {attempt.isPending ? 'Making the trial…' : 'Try this'}
          </Button>
        ) : (
          <span className="text-sm text-ink-soft">Dyers start a planned trial from a suggestion.</span>
        )}
        <FormAlert message={attempt.error ? formMessage(attempt.error) : null} />
      </div>
    </li>
  );
}
