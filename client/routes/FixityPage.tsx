import { Page } from '../components/Page';
import { useCan } from '../features/auth/api';
import { FixityPanel } from '../features/fixity/components/FixityPanel';

export function FixityPage() {
  const can = useCan();
  return (
    <Page
      title="Fixity"
      lead="Masters are kept byte for byte; this check re-reads each one and compares its SHA-256 with the value recorded at upload."
    >
      {can('fixity:run') ? <FixityPanel /> : <p className="text-ink-soft">Only admins run fixity checks.</p>}
    </Page>
  );
}
