import type { SeriesDetail } from '../api';

type M = SeriesDetail['materials']['whole'];

export function MaterialsTable({ m, label }: { m: M; label: string }) {
  return (
    <div>
      <table className="w-full text-sm" aria-label={label}>
        <thead className="text-left text-ink-soft border-b border-rule"><tr><th className="py-1.5 pr-3">Material</th><th className="pr-3 text-right">Needed (g)</th><th className="text-right">With {m.deadVolumePct} % allowance (g)</th></tr></thead>
        <tbody className="num">
          {m.items.map((i) => (
            <tr key={`${i.kind}${i.refId}`} className="border-b border-rule"><td className="py-1 pr-3 font-sans">{i.name} <span className="text-ink-faint">({i.kind})</span></td><td className="pr-3 text-right">{i.grams}</td><td className="text-right">{i.withAllowanceG}</td></tr>
          ))}
          <tr><td className="py-1 pr-3 font-sans">Fibre, dry</td><td className="pr-3 text-right">{m.fibreG}</td><td /></tr>
          <tr><td className="py-1 pr-3 font-sans">Liquor, all baths (L)</td><td className="pr-3 text-right">{m.liquorL}</td><td className="text-right">{m.liquorWithAllowanceL}</td></tr>
        </tbody>
      </table>
    </div>
  );
}
