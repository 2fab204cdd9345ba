import type { SeriesDetail } from '../api';

type M = NonNullable<SeriesDetail['materials']>['whole'];

export function MaterialsTable({ m, deadVolumePct, label }: { m: M; deadVolumePct: number; label: string }) {
  return (
    <table className="w-full text-sm" aria-label={label}>
      <thead className="text-left text-ink-soft border-b border-rule">
        <tr>
          <th className="py-1.5 pr-3">Material</th>
          <th className="pr-3 text-right">Needed (g)</th>
          <th className="text-right">With {deadVolumePct} % allowance (g)</th>
        </tr>
      </thead>
      <tbody className="num">
        {m.lines.map((i) => (
          <tr key={`${i.kind}${i.refId ?? i.name}`} className="border-b border-rule">
            <td className="py-1 pr-3 font-sans">
              {i.name} <span className="text-ink-faint">({i.kind})</span>
            </td>
            <td className="pr-3 text-right">{i.grams}</td>
            <td className="text-right">{i.gramsWithAllowance}</td>
          </tr>
        ))}
        <tr>
          <td className="py-1 pr-3 font-sans">Fibre, dry (g)</td>
          <td className="pr-3 text-right">{m.fibreG}</td>
          <td />
        </tr>
        <tr>
          <td className="py-1 pr-3 font-sans">Liquor, all baths (L)</td>
          <td className="pr-3 text-right">{m.bathL}</td>
          <td className="text-right">{m.bathLWithAllowance}</td>
        </tr>
      </tbody>
    </table>
  );
}
