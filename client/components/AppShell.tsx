import { NavLink, Outlet, Link } from 'react-router-dom';
import { paths } from '../paths';
import { Wordmark } from './Wordmark';
import { UserMenu } from '../features/auth/components/UserMenu';
import { useCan } from '../features/auth/api';

const areas = [
  { to: paths.archive(), label: 'Archive' },
  { to: paths.search(), label: 'Find' },
  { to: paths.trials(), label: 'Trials' },
  { to: paths.baths(), label: 'Baths' },
  { to: paths.series(), label: 'Series' },
  { to: paths.reference(), label: 'Reference' },
  { to: paths.importPieces(), label: 'Import', action: 'import:run' },
] as const;

export function AppShell() {
  const can = useCan();
  return (
    <div className="min-h-screen flex flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 bg-sheet px-3 py-2 rounded">
        Skip to content
      </a>
      <header className="border-b border-rule bg-sheet">
        <div className="mx-auto max-w-7xl px-4 md:px-6 min-h-14 py-2 flex flex-wrap items-center justify-between gap-x-6 gap-y-1">
          <Link to={paths.home()} aria-label="Tinctoria home">
            <Wordmark compact />
          </Link>
          {/* Below lg the areas take a row of their own, so none hide behind a scroll at tablet width. */}
          <nav aria-label="Main" className="order-last w-full overflow-x-auto lg:order-none lg:w-auto lg:flex-1">
            <ul className="flex gap-1 text-sm">
              {areas.filter((a) => !('action' in a) || can(a.action)).map((a) => (
                <li key={a.to}>
                  <NavLink
                    to={a.to}
                    className={({ isActive }) =>
                      `block px-3 py-1.5 rounded-md whitespace-nowrap ${isActive ? 'bg-neutral-light text-ink font-medium' : 'text-ink-soft hover:text-ink hover:bg-paper'}`
                    }
                  >
                    {a.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          <UserMenu />
        </div>
      </header>
      <main id="main" className="flex-1 mx-auto w-full max-w-7xl px-4 md:px-6 py-6">
        <Outlet />
      </main>
      <footer className="border-t border-rule text-xs text-ink-faint">
        <div className="mx-auto max-w-7xl px-4 md:px-6 py-3">
          Tinctoria — archive and reproduction notebook for dyed and printed textiles. Colour values are CIELAB, each labelled with its illuminant and observer; image palettes are estimates (D65/2°), instrument readings outrank them.
        </div>
      </footer>
    </div>
  );
}
