import { useRef, useState, type KeyboardEvent, type MouseEvent } from 'react';
import { CORNER_NAMES, patchGeometry, isConvexQuad, type Point } from '../../../../shared/compute/chart';
import { chartInputSchema, cornerIssues, type PhotoChart } from '../../../../shared/schemas/chart';
import { formatNumber } from '../../../../shared/format';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { formMessage, useFormErrors } from '../../../lib/form';
import type { Photo } from '../../pieces';
import { useChart } from '../api';

type Draft = Array<{ x: string; y: string }>;
const EMPTY: Draft = [0, 1, 2, 3].map(() => ({ x: '', y: '' }));
const SHORT = ['1', '6', '24', '19'];

/** "L, a, b" per line (24 lines), as pasted from a spreadsheet or a CSV; the schema says what is wrong. */
function parseMeasured(text: string) {
  const lines = text
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean);
  return lines.map((l) => {
    const [L, a, b] = l.split(/[,;\t ]+/).map((v) => (v === '' || Number.isNaN(Number(v)) ? v : Number(v)));
    return { L, a, b };
  });
}

const f1 = (v: number) => formatNumber(v, 1);

/**
 * The colour chart mode of a photo: place the centres of patches 1, 6, 24 and 19 (click on the photo, type the
 * pixels, or move the chosen point with the arrow keys, Shift for bigger steps); the 24 patch boxes follow; send
 * it to see each patch's ΔE00 before and after the correction, the grade and the calibrated palette.
 */
export function ChartPanel({ photo, canEdit }: { photo: Photo; canEdit: boolean }) {
  const chart = photo.chart;
  const [draft, setDraft] = useState<Draft>(() =>
    chart ? chart.corners.map((p) => ({ x: String(Math.round(p.x)), y: String(Math.round(p.y)) })) : EMPTY,
  );
  const [selected, setSelected] = useState(0);
  const [reference, setReference] = useState<'published-1976' | 'measured'>(
    chart?.reference === 'measured' ? 'measured' : 'published-1976',
  );
  const [measured, setMeasured] = useState('');
  const { formRef, errors, check, show, fromServer } = useFormErrors();
  const save = useChart(photo);
  const img = useRef<HTMLImageElement>(null);
  const markers = useRef<Array<HTMLButtonElement | null>>([]);

  const points: Array<Point | null> = draft.map((d) =>
    d.x.trim() !== '' && d.y.trim() !== '' && !Number.isNaN(Number(d.x)) && !Number.isNaN(Number(d.y))
      ? { x: Number(d.x), y: Number(d.y) }
      : null,
  );
  const all = points.every(Boolean) ? (points as Point[]) : null;
  const preview = all && isConvexQuad(all) ? patchGeometry(all) : null;
  const pct = (v: number, of: number) => `${(v / of) * 100}%`;

  const setPoint = (i: number, p: Point) =>
    setDraft((d) =>
      d.map((q, k) =>
        k === i
          ? {
              x: String(Math.round(Math.min(photo.width - 1, Math.max(0, p.x)))),
              y: String(Math.round(Math.min(photo.height - 1, Math.max(0, p.y)))),
            }
          : q,
      ),
    );

  const onClick = (e: MouseEvent) => {
    if (!canEdit || !img.current) return;
    const box = img.current.getBoundingClientRect();
    setPoint(selected, {
      x: ((e.clientX - box.left) / box.width) * photo.width,
      y: ((e.clientY - box.top) / box.height) * photo.height,
    });
    const next = points.findIndex((p, k) => !p && k !== selected);
    if (next >= 0) setSelected(next);
  };

  const onKey = (i: number) => (e: KeyboardEvent) => {
    const moves: Record<string, [number, number]> = {
      ArrowLeft: [-1, 0],
      ArrowRight: [1, 0],
      ArrowUp: [0, -1],
      ArrowDown: [0, 1],
    };
    const m = moves[e.key];
    if (!m || !points[i]) return;
    e.preventDefault();
    // One screen pixel of the shown photo per press (ten with Shift).
    const perScreenPx = img.current ? photo.width / img.current.getBoundingClientRect().width : 1;
    const step = Math.max(1, Math.round(perScreenPx)) * (e.shiftKey ? 10 : 1);
    setPoint(i, { x: points[i]!.x + m[0] * step, y: points[i]!.y + m[1] * step });
  };

  const num = (v: string) => (v.trim() === '' ? undefined : Number.isNaN(Number(v)) ? v : Number(v));

  async function submit() {
    const raw = {
      corners: draft.map((d) => ({ x: num(d.x), y: num(d.y) })),
      reference: reference === 'published-1976' ? 'published-1976' : { measured: parseMeasured(measured) },
    };
    const data = check(chartInputSchema, raw);
    if (!data) return;
    const outside = cornerIssues(data.corners, photo);
    if (Object.keys(outside).length) return show(outside);
    try {
      await save.mutateAsync(data);
    } catch (e) {
      const message = formMessage(e);
      if (message) show({ _: [message] });
      else fromServer(e);
    }
  }

  return (
    <section className="space-y-4" aria-label="Colour chart" data-testid="chart-panel">
      <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
        <div className="relative select-none bg-neutral-ground" onClick={onClick} data-testid="chart-photo">
          <img
            ref={img}
            src={photo.urls.display}
            alt={`Photo ${photo.id} with its colour chart`}
            className="block w-full"
            draggable={false}
          />
          <svg
            className="pointer-events-none absolute inset-0 h-full w-full"
            viewBox={`0 0 ${photo.width} ${photo.height}`}
            preserveAspectRatio="none"
            aria-hidden="true"
          >
            {(preview ?? chart?.patches ?? []).map((g) => (
              <rect
                key={g.patch}
                data-testid="patch-box"
                x={g.centre.x - g.half}
                y={g.centre.y - g.half}
                width={2 * g.half}
                height={2 * g.half}
                fill="none"
                stroke="#ffffff"
                strokeWidth={Math.max(1, photo.width / 500)}
                vectorEffect="non-scaling-stroke"
                style={{ outline: '1px solid black' }}
              />
            ))}
          </svg>
          {points.map((p, i) =>
            p ? (
              <button
                key={i}
                type="button"
                ref={(el) => {
                  markers.current[i] = el;
                }}
                className={`absolute -translate-x-1/2 -translate-y-1/2 rounded-full border-2 px-1 text-[10px] font-bold ${
                  i === selected ? 'border-action bg-action text-white' : 'border-black bg-white text-ink'
                }`}
                style={{ left: pct(p.x, photo.width), top: pct(p.y, photo.height) }}
                aria-label={`Corner ${CORNER_NAMES[i]} at ${p.x}, ${p.y} px: arrow keys move it, Shift for bigger steps`}
                disabled={!canEdit}
                onClick={(e) => {
                  e.stopPropagation();
                  setSelected(i);
                }}
                onFocus={() => setSelected(i)}
                onKeyDown={onKey(i)}
              >
                {SHORT[i]}
              </button>
            ) : null,
          )}
        </div>
        {canEdit ? (
          <form
            ref={formRef}
            className="space-y-3"
            aria-label="Colour chart corners"
            onSubmit={(e) => {
              e.preventDefault();
              void submit();
            }}
          >
            <p className="text-sm text-ink-soft">
              Click the centre of each corner patch in turn ({CORNER_NAMES.join(', ')}), or type it in pixels of the
              master ({photo.width} × {photo.height} px). Placing: <strong>{CORNER_NAMES[selected]}</strong>.
            </p>
            <fieldset className="space-y-2">
              <legend className="sr-only">Corner patches</legend>
              {draft.map((d, i) => (
                <div key={i} className="grid grid-cols-[auto_1fr_1fr] items-end gap-2">
                  <button
                    type="button"
                    className={`mb-2 w-20 rounded border px-2 py-1 text-xs ${i === selected ? 'border-action text-action' : 'border-rule-strong'}`}
                    aria-pressed={i === selected}
                    onClick={() => {
                      setSelected(i);
                      markers.current[i]?.focus();
                    }}
                  >
                    Place {SHORT[i]}
                  </button>
                  {(['x', 'y'] as const).map((k) => (
                    <Field
                      key={k}
                      label={`Patch ${SHORT[i]} ${k}`}
                      unit="px"
                      inputMode="numeric"
                      className="num"
                      value={d[k]}
                      onChange={(e) =>
                        setDraft((all) => all.map((q, j) => (j === i ? { ...q, [k]: e.target.value } : q)))
                      }
                      error={errors[`corners.${i}.${k}`]}
                    />
                  ))}
                </div>
              ))}
              {errors.corners ? (
                <p className="text-sm text-danger" data-field-error tabIndex={-1}>
                  {errors.corners.join(' ')}
                </p>
              ) : null}
            </fieldset>
            <label className="block text-sm font-medium">
              Reference values
              <select
                className="mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-2 py-2 text-sm"
                value={reference}
                onChange={(e) => setReference(e.target.value as typeof reference)}
              >
                <option value="published-1976">Published 1976 values (McCamy, Marcus &amp; Davidson)</option>
                <option value="measured">Our own measured values (24 L*a*b* D65)</option>
              </select>
            </label>
            {reference === 'measured' ? (
              <label className="block text-sm font-medium">
                Measured values: one patch a line, “L, a, b”, patch 1 to 24
                <textarea
                  rows={6}
                  className={`mt-1 block w-full rounded-md border bg-sheet px-3 py-2 font-mono text-xs ${errors['reference.measured'] || errors.reference ? 'border-danger' : 'border-rule-strong'}`}
                  aria-invalid={errors['reference.measured'] || errors.reference ? true : undefined}
                  value={measured}
                  onChange={(e) => setMeasured(e.target.value)}
                />
                {errors['reference.measured'] || errors.reference ? (
                  <span className="mt-1 block text-sm text-danger">
                    {(errors['reference.measured'] ?? errors.reference)!.join(' ')}
                  </span>
                ) : null}
              </label>
            ) : null}
            {errors._ ? (
              <p role="alert" className="text-sm text-danger">
                {errors._.join(' ')}
              </p>
            ) : null}
            <div className="flex flex-wrap gap-2">
              <Button type="submit" disabled={save.isPending}>
                {save.isPending ? 'Measuring…' : chart ? 'Measure the chart again' : 'Measure the chart'}
              </Button>
              {chart ? (
                <Button
                  type="button"
                  variant="quiet"
                  onClick={() => confirm('Remove the chart and its calibrated palettes?') && save.mutate(null)}
                >
                  Remove chart
                </Button>
              ) : null}
            </div>
          </form>
        ) : null}
      </div>
      {chart ? <ChartResult chart={chart} /> : null}
    </section>
  );
}

/** The grade, mean and maximum, and a bar chart of each patch's ΔE00 before and after (a table beside it). */
function ChartResult({ chart }: { chart: PhotoChart }) {
  const top = Math.max(1, ...chart.patches.map((p) => Math.max(p.deltaE00Before, p.deltaE00After)));
  const W = 24 * 30,
    H = 160;
  return (
    <div className="space-y-3" data-testid="chart-result">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-ink-soft">As photographed</dt>
        <dd className="num">
          mean ΔE00 {f1(chart.before.mean)}, max {f1(chart.before.max)} ·{' '}
          <strong data-testid="grade-before">{chart.grade.before ?? 'below every level'}</strong>
        </dd>
        <dt className="text-ink-soft">After calibration</dt>
        <dd className="num">
          mean ΔE00 {f1(chart.after.mean)}, max {f1(chart.after.max)} ·{' '}
          <strong data-testid="grade-after">{chart.grade.after ?? 'below every level'}</strong>
        </dd>
        <dt className="text-ink-soft">Levels</dt>
        <dd className="text-xs">{chart.tolerances.source}</dd>
        <dt className="text-ink-soft">Reference</dt>
        <dd className="text-xs">{chart.referenceSource}</dd>
      </dl>
      <figure>
        <svg
          viewBox={`0 0 ${W} ${H + 20}`}
          className="w-full max-w-3xl"
          role="img"
          aria-label={`ΔE00 per patch, before (grey) and after (dark) calibration; largest before ${f1(chart.before.max)}, after ${f1(chart.after.max)}`}
          data-testid="patch-error-chart"
        >
          {chart.patches.map((p, i) => {
            const hb = (p.deltaE00Before / top) * H,
              ha = (p.deltaE00After / top) * H;
            return (
              <g key={p.patch}>
                <rect x={i * 30 + 4} y={H - hb} width={10} height={hb} fill="#b9b2a6">
                  <title>{`Patch ${p.patch} ${p.name}: before ${f1(p.deltaE00Before)}`}</title>
                </rect>
                <rect x={i * 30 + 15} y={H - ha} width={10} height={ha} fill="#2d2a26">
                  <title>{`Patch ${p.patch} ${p.name}: after ${f1(p.deltaE00After)}`}</title>
                </rect>
                <text x={i * 30 + 15} y={H + 14} fontSize="10" textAnchor="middle">
                  {p.patch}
                </text>
              </g>
            );
          })}
        </svg>
        <figcaption className="text-xs text-ink-soft">
          ΔE00 per patch: grey before, dark after calibration (tallest bar {f1(top)}).
        </figcaption>
      </figure>
      <details className="text-xs">
        <summary className="cursor-pointer">Per-patch values</summary>
        <div className="overflow-x-auto">
          <table className="num mt-2 min-w-full">
            <thead>
              <tr>
                <th className="text-left">Patch</th>
                <th>Measured L* a* b*</th>
                <th>Reference L* a* b*</th>
                <th>ΔE00 before</th>
                <th>ΔE00 after</th>
              </tr>
            </thead>
            <tbody>
              {chart.patches.map((p) => (
                <tr key={p.patch}>
                  <td className="text-left">
                    {p.patch} {p.name}
                  </td>
                  <td>
                    {f1(p.measured.L)} {f1(p.measured.a)} {f1(p.measured.b)}
                  </td>
                  <td>
                    {f1(p.reference.L)} {f1(p.reference.a)} {f1(p.reference.b)}
                  </td>
                  <td>{f1(p.deltaE00Before)}</td>
                  <td>{f1(p.deltaE00After)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
    </div>
  );
}
