import type { BatchDetail } from '../api';

const W = 560;
const H = 180;
const PAD = { l: 48, r: 44, t: 12, b: 28 };

/** Remaining volume (solid, mL, left axis) and estimated strength (dashed, right axis) after each event. */
export function TimelineChart({ points, volumeMl }: { points: BatchDetail['timeline']; volumeMl: number }) {
  if (points.length < 2) return <p className="text-sm text-ink-faint">The chart appears after the first event.</p>;
  const maxMl = Math.max(volumeMl, ...points.map((p) => p.remainingMl)) || 1;
  const maxS = Math.max(1, ...points.map((p) => p.strength));
  const x = (i: number) => PAD.l + (i * (W - PAD.l - PAD.r)) / (points.length - 1);
  const yMl = (v: number) => PAD.t + (1 - v / maxMl) * (H - PAD.t - PAD.b);
  const yS = (v: number) => PAD.t + (1 - v / maxS) * (H - PAD.t - PAD.b);
  const line = (f: (p: BatchDetail['timeline'][number]) => number) =>
    points.map((p, i) => `${i ? 'L' : 'M'}${x(i).toFixed(1)},${f(p).toFixed(1)}`).join(' ');
  return (
    <figure>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="w-full max-w-xl"
        role="img"
        aria-label="Remaining volume and estimated strength over the batch's events"
      >
        <line x1={PAD.l} x2={W - PAD.r} y1={H - PAD.b} y2={H - PAD.b} stroke="#b9b9b6" />
        <text x={PAD.l - 6} y={yMl(maxMl) + 4} textAnchor="end" fontSize="10" fill="#4b4e52">
          {Math.round(maxMl)} mL
        </text>
        <text x={PAD.l - 6} y={yMl(0)} textAnchor="end" fontSize="10" fill="#4b4e52">
          0
        </text>
        <text x={W - PAD.r + 6} y={yS(maxS) + 4} fontSize="10" fill="#4b4e52">
          {maxS.toFixed(1)}×
        </text>
        <text x={W - PAD.r + 6} y={yS(0)} fontSize="10" fill="#4b4e52">
          0
        </text>
        <path d={line((p) => yMl(p.remainingMl))} fill="none" stroke="#2c4a63" strokeWidth="2" />
        <path d={line((p) => yS(p.strength))} fill="none" stroke="#8a5a00" strokeWidth="1.5" strokeDasharray="4 3" />
        {points.map((p, i) => (
          <circle key={i} cx={x(i)} cy={yMl(p.remainingMl)} r="3" fill="#2c4a63">
            <title>{`${p.type} ${p.at.slice(0, 10)}: ${p.remainingMl} mL, strength ≈ ${p.strength}`}</title>
          </circle>
        ))}
      </svg>
      <figcaption className="text-xs text-ink-faint">
        <span className="text-action">━</span> remaining volume (mL) · <span className="text-warn">╌</span> estimated
        strength (1 = as made; an estimate)
      </figcaption>
    </figure>
  );
}
