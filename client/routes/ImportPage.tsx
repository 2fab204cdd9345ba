import { Page } from '../components/Page';
import { useCan } from '../features/auth/api';
import { ImportPieces } from '../features/import/components/ImportPieces';

export function ImportPage() {
  const can = useCan();
  return (
    <Page
      title="Import pieces"
      lead="Bring a spreadsheet catalogue in: every row is checked first, then all rows are added together, or none."
    >
      {can('import:run') ? <ImportPieces /> : <p className="text-ink-soft">Only curators and admins import pieces.</p>}
    </Page>
  );
}
