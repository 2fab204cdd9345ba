import { conditionsText } from '../../../../shared/colour/conditions';
import { FormAlert } from '../../../components/form/FormAlert';
import { useCan } from '../../auth';
import { useAddPieceReading, useDeletePieceReading, usePieceTrials } from '../api';
import { fmt } from '../format';
import { MeasurementForm } from './ResultSection';
import { SpectrumChart } from './SpectrumChart';

/**
 * Instrument readings of the original: L*a*b* or a reflectance spectrum (pasted or from a CSV file). They are
 * offered as trial targets; a spectral one gives the metamerism table on a trial whose result is a spectrum too.
 */
export function PieceReadings({ pieceId, canEdit }: { pieceId: number; canEdit: boolean }) {
  const can = useCan();
  const list = usePieceTrials(pieceId);
  const add = useAddPieceReading(pieceId);
  const remove = useDeletePieceReading(pieceId);
  const readings = list.data?.targets.measurements ?? [];
  const mayAdd = canEdit && can('measurement:create');
  if (!readings.length && !mayAdd) return null;
  return (
    <section className="min-w-0 space-y-4" aria-labelledby="readings-h" data-testid="piece-readings">
      <h2 id="readings-h" className="font-serif text-2xl">
        Readings of the original
      </h2>
      <p className="text-xs text-ink-soft">
        Instrument readings of the piece itself. Trials aim at them; when a reading is a spectrum and a trial's result
        is one too, the trial page shows how the match holds under each light.
      </p>
      {readings.length ? (
        <div className="max-w-3xl overflow-x-auto">
          <table className="w-full rounded-lg border border-rule bg-sheet text-sm">
            <caption className="sr-only">Readings of the original</caption>
            <thead className="bg-paper text-left text-ink-soft">
              <tr>
                <th className="px-3 py-1.5">Place</th>
                <th className="px-3 py-1.5 text-right">L*</th>
                <th className="px-3 py-1.5 text-right">a*</th>
                <th className="px-3 py-1.5 text-right">b*</th>
                <th className="px-3 py-1.5">Illuminant/observer</th>
                <th className="px-3 py-1.5">Spectrum</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {readings.map((m) => (
                <tr key={m.id} className="border-t border-rule">
                  <td className="px-3 py-1.5">{m.label ?? '—'}</td>
                  <td className="px-3 py-1.5 text-right font-mono">{fmt(m.L, 2)}</td>
                  <td className="px-3 py-1.5 text-right font-mono">{fmt(m.a, 2)}</td>
                  <td className="px-3 py-1.5 text-right font-mono">{fmt(m.b, 2)}</td>
                  <td className="px-3 py-1.5">{conditionsText(m)}</td>
                  <td className="px-3 py-1.5">
                    {m.spectrum
                      ? `${m.spectrum.startNm}–${m.spectrum.startNm + m.spectrum.intervalNm * (m.spectrum.values.length - 1)} nm`
                      : '—'}
                  </td>
                  <td className="px-3 py-1.5">
                    {mayAdd ? (
                      <button
                        type="button"
                        className="text-xs text-danger underline"
                        onClick={() =>
                          confirm('Remove this reading? Trials aiming at it lose their target.') && remove.mutate(m.id)
                        }
                      >
                        Remove
                      </button>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <p className="text-sm text-ink-soft">No readings of the original yet.</p>
      )}
      {remove.error ? <FormAlert message={remove.error.message} /> : null}
      {readings.some((m) => m.spectrum) ? (
        <SpectrumChart
          title="Reflectance spectra of the original"
          series={readings.flatMap((m, i) =>
            m.spectrum ? [{ label: m.label ?? `Reading ${i + 1} (${conditionsText(m)})`, spectrum: m.spectrum }] : [],
          )}
        />
      ) : null}
      {mayAdd ? <MeasurementForm add={add} name="Add a reading of the original" withLabel /> : null}
    </section>
  );
}
