import { formatNumber } from '../../../../shared/format';
import type { ShadeItem } from '../../../../shared/schemas/search';
import { IMAGE_ESTIMATE, ViewingConditions } from '../../../components/ViewingConditions';

type Props = { items: ShadeItem[]; query: { L: number; a: number; b: number; hex: string } };

const SIZE = 280;
const PAD = 24;

/**
 * Matches on the a*b* plane (hue as angle, chroma as distance from the centre)
 * with lightness on its own L* scale beside it. Plain SVG on a neutral ground.
 */
export function AbPlot({ items, query }: Props) {
  const reach =
    Math.max(
      20,
      ...items.flatMap((i) => [Math.abs(i.colour.lab.a), Math.abs(i.colour.lab.b)]),
      Math.abs(query.a),
      Math.abs(query.b),
    ) * 1.1;
  const x = (a: number) => PAD + ((a + reach) / (2 * reach)) * (SIZE - 2 * PAD);
  const y = (b: number) => SIZE - PAD - ((b + reach) / (2 * reach)) * (SIZE - 2 * PAD);
  const ly = (L: number) => SIZE - PAD - (L / 100) * (SIZE - 2 * PAD);
  const tick = Math.round(reach / 2 / 10) * 10 || 10;
  return (
    <figure className="rounded-lg border border-rule bg-sheet p-3">
      <svg
        viewBox={`0 0 ${SIZE + 70} ${SIZE}`}
        className="w-full max-w-md"
        role="img"
        aria-labelledby="abplot-title abplot-desc"
      >
        <title id="abplot-title">Matches on the a*b* plane</title>
        <desc id="abplot-desc">
          {items.length} matching colours around the chosen shade {query.hex}; hue is the angle, chroma the distance
          from the centre; lightness is on the separate scale.
        </desc>
        <rect x={PAD} y={PAD} width={SIZE - 2 * PAD} height={SIZE - 2 * PAD} fill="#808080" />
        <line x1={x(0)} x2={x(0)} y1={PAD} y2={SIZE - PAD} stroke="#a6a6a6" />
        <line y1={y(0)} y2={y(0)} x1={PAD} x2={SIZE - PAD} stroke="#a6a6a6" />
        {[-tick, tick].map((t) => (
          <g key={t} className="num" fontSize="9" fill="#4b4e52">
            <text x={x(t)} y={SIZE - PAD + 12} textAnchor="middle">
              {t}
            </text>
            <text x={PAD - 4} y={y(t) + 3} textAnchor="end">
              {t}
            </text>
          </g>
        ))}
        <text x={SIZE - PAD} y={SIZE - 4} fontSize="10" textAnchor="end" fill="#4b4e52">
          a* (green − / red +)
        </text>
        <text x={4} y={PAD - 8} fontSize="10" fill="#4b4e52">
          b* (blue − / yellow +)
        </text>
        {items.map((i) => (
          <circle
            key={`${i.pieceId}-${i.photoId}`}
            cx={x(i.colour.lab.a)}
            cy={y(i.colour.lab.b)}
            r={3 + 5 * Math.sqrt(i.colour.share)}
            fill={i.colour.hex}
            stroke="#ffffff"
            strokeWidth="0.75"
          >
            <title>{`${i.accessionNumber}: L* ${formatNumber(i.colour.lab.L)}, a* ${formatNumber(i.colour.lab.a)}, b* ${formatNumber(i.colour.lab.b)}, ΔE00 ${i.deltaE00.toFixed(2)}`}</title>
          </circle>
        ))}
        <circle cx={x(query.a)} cy={y(query.b)} r={7} fill="none" stroke="#1d1f21" strokeWidth="2" />
        <g transform={`translate(${SIZE + 10},0)`}>
          <text x={0} y={PAD - 8} fontSize="10" fill="#4b4e52">
            L*
          </text>
          <rect x={0} y={PAD} width={16} height={SIZE - 2 * PAD} fill="url(#lscale)" stroke="#b9b9b6" />
          <defs>
            <linearGradient id="lscale" x1="0" x2="0" y1="0" y2="1">
              <stop offset="0" stopColor="#ffffff" />
              <stop offset="1" stopColor="#000000" />
            </linearGradient>
          </defs>
          {[0, 50, 100].map((L) => (
            <text key={L} x={44} y={ly(L) + 3} fontSize="9" className="num" fill="#4b4e52">
              {L}
            </text>
          ))}
          {items.map((i) => (
            <line
              key={`${i.pieceId}-${i.photoId}`}
              x1={18}
              x2={30}
              y1={ly(i.colour.lab.L)}
              y2={ly(i.colour.lab.L)}
              stroke={i.colour.hex}
              strokeWidth="2"
            />
          ))}
          <path d={`M 30 ${ly(query.L)} l 8 -4 v 8 z`} fill="#1d1f21" />
        </g>
      </svg>
      <figcaption className="mt-1 text-xs text-ink-faint">
        Ring and arrow: the chosen shade. Dot size: the colour's share of its photo. CIELAB,{' '}
        <ViewingConditions colour={IMAGE_ESTIMATE} className="text-ink-faint" />.
      </figcaption>
    </figure>
  );
}
