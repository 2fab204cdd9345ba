import { Page } from '../../../components/Page';
import { useCan } from '../../auth';
import { useChemicals, useDyestuffs } from '../api';
import { AddChemicalForm } from './AddChemicalForm';
import { AddDyestuffForm } from './AddDyestuffForm';
import { ChemicalsTable } from './ChemicalsTable';
import { DyestuffsTable } from './DyestuffsTable';

export function ReferencePage() {
  const chemicals = useChemicals();
  const dyestuffs = useDyestuffs();
  const manage = useCan()('reference:manage');
  return (
    <Page
      title="Reference"
      lead="Chemicals and dyestuffs used in trials and recipes. Molar masses and metal fractions are computed from each formula with the IUPAC 2021 abridged atomic weights; hazard data must be checked against the supplier's safety data sheet before use."
    >
      <section aria-labelledby="chemicals-heading" className="mb-10">
        <h2 id="chemicals-heading" className="text-xl font-semibold mb-3">
          Chemicals
        </h2>
        {chemicals.data ? (
          <ChemicalsTable chemicals={chemicals.data.items} />
        ) : chemicals.isError ? (
          <p role="alert" className="text-danger">
            The chemicals could not be loaded: {chemicals.error.message}
          </p>
        ) : (
          <p className="text-ink-faint">Loading chemicals…</p>
        )}
        {manage ? (
          <div className="mt-4">
            <AddChemicalForm />
          </div>
        ) : null}
      </section>
      <section aria-labelledby="dyestuffs-heading">
        <h2 id="dyestuffs-heading" className="text-xl font-semibold mb-3">
          Dyestuffs
        </h2>
        {dyestuffs.data ? (
          <DyestuffsTable dyestuffs={dyestuffs.data.items} />
        ) : dyestuffs.isError ? (
          <p role="alert" className="text-danger">
            The dyestuffs could not be loaded: {dyestuffs.error.message}
          </p>
        ) : (
          <p className="text-ink-faint">Loading dyestuffs…</p>
        )}
        {manage ? (
          <div className="mt-4">
            <AddDyestuffForm />
          </div>
        ) : null}
      </section>
    </Page>
  );
}
