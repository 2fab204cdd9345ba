import type { DyestuffView } from '../../../../shared/schemas/reference';

export function DyestuffsTable({ dyestuffs }: { dyestuffs: DyestuffView[] }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-sheet">
      <table className="w-full text-sm">
        <caption className="sr-only">Dyestuffs with their Colour Index generic names</caption>
        <thead className="bg-paper text-left text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">
              Dyestuff
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              C.I. generic name
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Principal colorants
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Source plant or animal
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Class
            </th>
          </tr>
        </thead>
        <tbody>
          {dyestuffs.map((d) => (
            <tr key={d.id} className="border-t border-rule align-top">
              <th scope="row" className="px-3 py-2 text-left font-medium">
                {d.name}
              </th>
              <td className="px-3 py-2 whitespace-nowrap">{d.ciName ?? <span className="text-ink-faint">—</span>}</td>
              <td className="px-3 py-2">{d.colorants ?? '—'}</td>
              <td className="px-3 py-2 italic">{d.species ?? '—'}</td>
              <td className="px-3 py-2 text-ink-soft">{d.dyeClass ?? '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
