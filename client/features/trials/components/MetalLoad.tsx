import type { TrialView } from '../api';
import { grams, fmt, METAL_NAMES } from '../format';

/** "What this reproduction avoided": grams of each metal before and after the substitutions. */
export function MetalLoad({ load }: { load: TrialView['metalLoad'] }) {
  const avoided = load.rows.filter((r) => r.avoidedG > 0 && r.heavy);
  return (
    <div className="space-y-3">
      {avoided.length ? (
        <ul className="space-y-1" aria-label="What this reproduction avoided">
          {avoided.map((r) => (
            <li key={r.metal} className="text-lg">
              <span className="font-mono font-semibold">{grams(r.avoidedG)}</span> of {METAL_NAMES[r.metal] ?? r.metal}{' '}
              not used
              <span className="ml-2 text-sm text-ink-soft">
                (<span className="font-mono">{fmt(r.beforeGPerKgFibre, 2)} g</span> per kg fibre)
              </span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-ink-soft">
          No heavy metal avoided yet: record the historical amount of each substitution to see it.
        </p>
      )}
      {load.rows.length ? (
        <div className="overflow-x-auto rounded-lg border border-rule bg-sheet">
          <table className="w-full text-sm">
            <caption className="sr-only">Metal load before and after</caption>
            <thead className="bg-paper text-left text-ink-soft">
              <tr>
                <th className="px-3 py-2">Metal</th>
                <th className="px-3 py-2 text-right">Historical (this batch)</th>
                <th className="px-3 py-2 text-right">Modern (this batch)</th>
                <th className="px-3 py-2 text-right">Historical per kg fibre</th>
                <th className="px-3 py-2 text-right">Modern per kg fibre</th>
              </tr>
            </thead>
            <tbody>
              {load.rows.map((r) => (
                <tr key={r.metal} className="border-t border-rule">
                  <td className="px-3 py-2">
                    {METAL_NAMES[r.metal] ?? r.metal} <span className="font-mono text-ink-faint">{r.metal}</span>
                    {r.heavy ? <span className="ml-1 text-xs text-danger">heavy metal</span> : null}
                  </td>
                  <td className="px-3 py-2 text-right font-mono">{grams(r.beforeG)}</td>
                  <td className="px-3 py-2 text-right font-mono">{grams(r.afterG)}</td>
                  <td className="px-3 py-2 text-right font-mono">{fmt(r.beforeGPerKgFibre, 3)} g/kg</td>
                  <td className="px-3 py-2 text-right font-mono">{fmt(r.afterGPerKgFibre, 3)} g/kg</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      <p className="text-xs text-ink-faint">
        Metal mass = chemical mass × metal mass fraction from the formula (IUPAC 2021 abridged atomic weights), for{' '}
        <span className="font-mono">{fmt(load.fibreMassG, 1)} g</span> dry fibre.
        {load.incomplete
          ? ` ${load.incomplete} substitution${load.incomplete === 1 ? ' has' : 's have'} no amount and ${load.incomplete === 1 ? 'is' : 'are'} left out.`
          : ''}
      </p>
    </div>
  );
}
