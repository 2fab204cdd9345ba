import { useId } from 'react';
import { formatNumber } from '../../../../shared/format';

export type SpectrumSeries = {
  label: string;
  spectrum: { startNm: number; intervalNm: number; values: number[] };
};

// Each curve has its own colour and dash, so the lines are told apart without colour too.
const STYLES = [
  { stroke: 'var(--color-ink)', dash: undefined },
  { stroke: 'var(--color-action)', dash: '6 3' },
  { stroke: 'var(--color-warn)', dash: '2 3' },
  { stroke: 'var(--color-danger)', dash: '8 3 2 3' },
  { stroke: 'var(--color-ok)', dash: '1 2' },
];
const W = 480,
  H = 270,
  M = { left: 50, right: 12, top: 12, bottom: 44 };

const points = (s: SpectrumSeries['spectrum']) =>
  s.values.map((v, i) => ({ nm: s.startNm + i * s.intervalNm, pct: v * 100 }));

/**
 * Reflectance spectra drawn as curves: wavelength in nm across, reflectance in % up, both axes
 * labelled. The numbers themselves are in a table behind "Values", for keyboards and screen readers.
 */
export function SpectrumChart({ series, title }: { series: SpectrumSeries[]; title: string }) {
  const id = useId();
  const all = series.flatMap((s) => points(s.spectrum));
  const nm0 = Math.min(360, ...all.map((p) => p.nm)),
    nm1 = Math.max(780, ...all.map((p) => p.nm));
  const top = Math.max(100, Math.ceil(Math.max(...all.map((p) => p.pct)) / 10) * 10);
  const x = (nm: number) => M.left + ((nm - nm0) / (nm1 - nm0)) * (W - M.left - M.right);
  const y = (pct: number) => H - M.bottom - (pct / top) * (H - M.top - M.bottom);
  const xTicks = Array.from(
    { length: Math.floor((nm1 - nm0) / 50) + 1 },
    (_, i) => Math.ceil(nm0 / 50) * 50 + i * 50,
  ).filter((t) => t <= nm1);
  const yTicks = Array.from({ length: top / 20 + 1 }, (_, i) => i * 20);
  const range = (s: SpectrumSeries['spectrum']) =>
    `${s.startNm}–${s.startNm + s.intervalNm * (s.values.length - 1)} nm every ${s.intervalNm} nm`;
  return (
    <figure className="max-w-xl">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="h-auto w-full rounded-lg border border-rule bg-sheet"
        role="img"
        aria-labelledby={`${id}-t`}
        aria-describedby={`${id}-d`}
      >
        <title id={`${id}-t`}>{title}</title>
        <desc id={`${id}-d`}>
          Reflectance in percent against wavelength in nanometres:{' '}
          {series.map((s) => `${s.label}, ${range(s.spectrum)}`).join('; ')}.
        </desc>
        <g fontSize="13" fill="var(--color-ink-soft)">
          {yTicks.map((t) => (
            <g key={`y${t}`}>
              <line
                x1={M.left}
                x2={W - M.right}
                y1={y(t)}
                y2={y(t)}
                stroke="var(--color-rule)"
                strokeWidth={t ? 0.5 : 1}
              />
              <text x={M.left - 6} y={y(t) + 4} textAnchor="end">
                {t}
              </text>
            </g>
          ))}
          {xTicks.map((t) => (
            <g key={`x${t}`}>
              <line x1={x(t)} x2={x(t)} y1={H - M.bottom} y2={H - M.bottom + 4} stroke="var(--color-ink-soft)" />
              <text x={x(t)} y={H - M.bottom + 18} textAnchor="middle">
                {t}
              </text>
            </g>
          ))}
          <line x1={M.left} x2={M.left} y1={M.top} y2={H - M.bottom} stroke="var(--color-ink-soft)" />
          <text x={(M.left + W - M.right) / 2} y={H - 6} textAnchor="middle">
            Wavelength (nm)
          </text>
          <text transform={`translate(14 ${(M.top + H - M.bottom) / 2}) rotate(-90)`} textAnchor="middle">
            Reflectance (%)
          </text>
        </g>
        {series.map((s, i) => {
          const st = STYLES[i % STYLES.length];
          return (
            <polyline
              key={s.label}
              fill="none"
              stroke={st.stroke}
              strokeDasharray={st.dash}
              strokeWidth={2}
              points={points(s.spectrum)
                .map((p) => `${x(p.nm).toFixed(1)},${y(p.pct).toFixed(1)}`)
                .join(' ')}
            />
          );
        })}
      </svg>
      <figcaption className="mt-1 text-xs">
        <ul className="flex flex-wrap gap-x-4 gap-y-1">
          {series.map((s, i) => {
            const st = STYLES[i % STYLES.length];
            return (
              <li key={s.label} className="flex items-center gap-1.5">
                <svg width="28" height="8" aria-hidden="true">
                  <line x1="0" x2="28" y1="4" y2="4" stroke={st.stroke} strokeDasharray={st.dash} strokeWidth="2" />
                </svg>
                {s.label} <span className="text-ink-faint">({range(s.spectrum)})</span>
              </li>
            );
          })}
        </ul>
        <details className="mt-1">
          <summary className="cursor-pointer text-action">Values</summary>
          <div className="mt-1 max-h-64 overflow-auto">
            <table className="text-xs">
              <thead className="text-left text-ink-soft">
                <tr>
                  <th className="pr-3">Wavelength (nm)</th>
                  {series.map((s) => (
                    <th key={s.label} className="pr-3 text-right">
                      {s.label} (%)
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody className="font-mono">
                {[...new Set(all.map((p) => p.nm))]
                  .sort((a, b) => a - b)
                  .map((nm) => (
                    <tr key={nm}>
                      <td className="pr-3">{nm}</td>
                      {series.map((s) => {
                        const p = points(s.spectrum).find((q) => q.nm === nm);
                        return (
                          <td key={s.label} className="pr-3 text-right">
                            {p ? formatNumber(p.pct, 1) : '—'}
                          </td>
                        );
                      })}
                    </tr>
                  ))}
              </tbody>
            </table>
          </div>
        </details>
      </figcaption>
    </figure>
  );
}
