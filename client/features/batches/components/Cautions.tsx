import { ChemicalCaution } from '../../reference';
import type { BatchDetail } from '../api';

/** The shared caution (signal word, H statements, PPE, deferral to the SDS) for every chemical in the batch and its top-ups. */
export function Cautions({ items }: { items: BatchDetail['cautions'] }) {
  if (!items.length)
    return (
      <p className="text-sm text-ink-soft">
        No chemicals recorded; still read the supplier’s safety data sheet for anything you add.
      </p>
    );
  return (
    <div className="grid gap-2 md:grid-cols-2">
      {items.map((c) => (
        <ChemicalCaution key={c.id} chemical={c} modernUse />
      ))}
    </div>
  );
}
