import { Link, useLocation, useNavigate } from 'react-router-dom';
import { useLogout, useMe } from '../api';
import { paths } from '../../../paths';
import { roleLabel } from '../../team';

// Shown by ability; the server leaves the outbox out in production, where it does not exist.
const adminLinks = [
  { action: 'team:manage', to: paths.team(), label: 'Team' },
  { action: 'fixity:run', to: paths.fixity(), label: 'Fixity' },
  // The imaging tolerance levels a colour chart's capture is graded against.
  { action: 'reference:manage', to: paths.imagingTolerances(), label: 'Tolerances' },
  { action: 'outbox:read', to: paths.outbox(), label: 'Outbox' },
] as const;

export function UserMenu() {
  const me = useMe();
  const logout = useLogout();
  const navigate = useNavigate();
  const location = useLocation();
  if (me.isPending) return null;
  // Signing in from a page comes back to it (the start page and sign-in itself need no return).
  const here = location.pathname + location.search;
  if (!me.data)
    return (
      <Link
        to={
          location.pathname === paths.signIn()
            ? here
            : location.pathname === paths.home()
              ? paths.signIn()
              : paths.signIn(here)
        }
        className="rounded-md border border-rule-strong px-3 py-1.5 text-sm hover:bg-paper"
      >
        Sign in
      </Link>
    );
  const { user, abilities } = me.data;
  return (
    <div className="flex items-center gap-3 text-sm">
      {adminLinks.some((l) => abilities[l.action]) ? (
        <nav aria-label="Administration" className="hidden md:flex gap-3">
          {adminLinks
            .filter((l) => abilities[l.action])
            .map((l) => (
              <Link key={l.to} to={l.to} className="text-ink-soft hover:text-ink">
                {l.label}
              </Link>
            ))}
        </nav>
      ) : null}
      <span className="hidden md:inline text-ink-soft" data-testid="signed-in-as">
        {user.name} · <span className="text-ink-faint">{roleLabel[user.role]}</span>
      </span>
      <button
        type="button"
        className="rounded-md border border-rule-strong px-3 py-1.5 hover:bg-paper"
        onClick={() => logout.mutate(undefined, { onSuccess: () => navigate(paths.home()) })}
      >
        Sign out
      </button>
    </div>
  );
}
