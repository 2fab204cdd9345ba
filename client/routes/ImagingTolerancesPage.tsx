import { Page } from '../components/Page';
import { ChartTolerancesPanel } from '../features/photos/components/ChartTolerancesPanel';

export function ImagingTolerancesPage() {
  return (
    <Page
      title="Imaging tolerances"
      lead="A colour chart marked in a photo grades the capture by the colour error on its 24 patches (mean and largest ΔE00). These are the levels it is graded against."
    >
      <ChartTolerancesPanel />
    </Page>
  );
}
