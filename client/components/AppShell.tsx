import { useState } from 'react';
import { NavLink, Outlet, Link } from 'react-router-dom';
import { paths } from '../paths';
import { Wordmark } from './Wordmark';
import { UserMenu } from '../features/auth/components/UserMenu';
import { useCan } from '../features/auth/api';

// Each area with the ability it needs, so the menu offers only what the reader can open (visitors: no trials, baths or series).
const areas = [
  { to: paths.archive(), label: 'Archive' },
  { to: paths.search(), label: 'Find' },
  { to: paths.trials(), label: 'Trials', action: 'trial:read' },
  { to: paths.baths(), label: 'Baths', action: 'batch:read' },
  { to: paths.series(), label: 'Series', action: 'series:read' },
  { to: paths.reference(), label: 'Reference' },
  { to: paths.importPieces(), label: 'Import', action: 'import:run' },
] as const;
const adminAreas = [
  { to: paths.team(), label: 'Team', action: 'team:manage' },
  { to: paths.fixity(), label: 'Fixity', action: 'fixity:run' },
  { to: paths.imagingTolerances(), label: 'Tolerances', action: 'reference:manage' },
  { to: paths.outbox(), label: 'Outbox', action: 'outbox:read' },
] as const;

const linkClass = ({ isActive }: { isActive: boolean }) =>
  `block px-3 py-1.5 rounded-md whitespace-nowrap ${isActive ? 'bg-neutral-light text-ink font-medium' : 'text-ink-soft hover:text-ink hover:bg-paper'}`;

export function AppShell() {
  const can = useCan();
  const [menuOpen, setMenuOpen] = useState(false);
  const close = () => setMenuOpen(false);
  return (
    <div className="min-h-screen flex flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 bg-sheet px-3 py-2 rounded"
      >
        Skip to content
      </a>
      <header className="border-b border-rule bg-sheet">
        <div className="mx-auto max-w-7xl px-4 md:px-6 min-h-14 py-2 flex flex-wrap items-center justify-between gap-x-3 md:gap-x-6 gap-y-1">
          <Link to={paths.home()} aria-label="Tinctoria home">
            <Wordmark compact />
          </Link>
          {/* On a phone the areas fold behind one button; a row of seven would push the page sideways. */}
          <button
            type="button"
            className="ml-auto md:hidden rounded-md border border-rule-strong px-3 py-1.5 text-sm hover:bg-paper"
            aria-expanded={menuOpen}
            aria-controls="main-menu"
            onClick={() => setMenuOpen((o) => !o)}
          >
            {menuOpen ? 'Close menu' : 'Menu'}
          </button>
          {/* Below lg the areas take a row of their own, so none hide behind a scroll at tablet width. */}
          <nav
            id="main-menu"
            aria-label="Main"
            className={`${menuOpen ? 'block' : 'hidden'} md:block order-last w-full lg:order-none lg:w-auto lg:flex-1`}
          >
            <ul className="flex flex-col md:flex-row md:flex-wrap gap-1 text-sm py-1 md:py-0">
              {areas
                .filter((a) => !('action' in a) || can(a.action))
                .map((a) => (
                  <li key={a.to}>
                    <NavLink to={a.to} className={linkClass} onClick={close}>
                      {a.label}
                    </NavLink>
                  </li>
                ))}
              {/* On a phone the user menu keeps only the sign-out button; its admin pages join this list. */}
              {adminAreas
                .filter((a) => can(a.action))
                .map((a) => (
                  <li key={a.to} className="md:hidden">
                    <NavLink to={a.to} className={linkClass} onClick={close}>
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
          Tinctoria — archive and reproduction notebook for dyed and printed textiles. Colour values are CIELAB, each
          labelled with its illuminant and observer; image palettes are estimates (D65/2°), instrument readings outrank
          them.
        </div>
      </footer>
    </div>
  );
}
