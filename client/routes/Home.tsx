import { useDocumentTitle } from '../lib/title';
import { Link } from 'react-router-dom';
import { Wordmark } from '../components/Wordmark';
import { useCan, useMe } from '../features/auth';
import { RoleHome } from '../features/home';
import { useHealth } from '../features/health/api';
import { paths } from '../paths';

const tasks = [
  {
    to: paths.archive(),
    title: 'Archive',
    text: 'Catalogue pieces to museum standards, with photos, regions and their measured palettes.',
  },
  {
    to: paths.search(),
    title: 'Find',
    text: 'Search by words, dyestuff and mordant, and by shade within a CIEDE2000 radius.',
  },
  {
    to: paths.trials(),
    title: 'Trials',
    action: 'trial:read',
    text: 'Record reproduction recipes, the safer mordants that replaced historical ones, and how close the result came.',
  },
  {
    to: paths.baths(),
    title: 'Baths',
    action: 'batch:read',
    text: 'Keep mordant baths and print pastes in use, topped up, until they are exhausted.',
  },
] as const;

export function Home() {
  useDocumentTitle(null);
  const health = useHealth();
  const can = useCan();
  // A signed-in person lands on their role's work (GET /api/home); visitors keep the introduction.
  const me = useMe().data;
  return (
    <div>
      <div className="py-8 md:py-12 border-b border-rule mb-8">
        <h1 className="sr-only">Tinctoria</h1>
        <Wordmark />
        <p className="mt-4 max-w-2xl text-lg text-ink-soft font-serif">
          An archive and reproduction notebook for historical dyed and printed textiles: catalogue the pieces, read
          their colours, and remake them with safer chemistry.
        </p>
      </div>
      {me ? (
        <div className="mb-8">
          <RoleHome />
        </div>
      ) : null}
      <ul className="grid gap-4 sm:grid-cols-2">
        {tasks
          .filter((t) => !('action' in t) || can(t.action))
          .map((t) => (
            <li key={t.to}>
              <Link
                to={t.to}
                className="block h-full rounded-lg border border-rule bg-sheet p-5 hover:border-rule-strong"
              >
                <h2 className="text-xl font-semibold">{t.title}</h2>
                <p className="mt-1 text-sm text-ink-soft">{t.text}</p>
              </Link>
            </li>
          ))}
      </ul>
      <p className="mt-8 text-xs text-ink-faint" aria-live="polite">
        {health.data
          ? `Version ${health.data.version} · database ${health.data.db}`
          : health.isError
            ? 'The server is not answering.'
            : 'Checking the server…'}
      </p>
    </div>
  );
}
