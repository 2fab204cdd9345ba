import type { ChemicalView } from '../../../../shared/schemas/reference';

const label: Record<ChemicalView['status'], string> = {
  permitted: 'permitted',
  restricted: 'restricted',
  'historical-only': 'historical only',
};
const tone: Record<ChemicalView['status'], string> = {
  permitted: 'bg-ok-tint text-ok',
  restricted: 'bg-warn-tint text-warn',
  'historical-only': 'bg-danger-tint text-danger',
};

export function StatusBadge({ status }: { status: ChemicalView['status'] }) {
  return (
    <span className={`inline-block rounded px-2 py-0.5 text-xs font-medium whitespace-nowrap ${tone[status]}`}>
      {label[status]}
    </span>
  );
}
