import { Link, useNavigate } from 'react-router-dom';
import { useLogout, useMe } from '../api';
import { paths } from '../../../paths';
import { roleLabel } from '../../team/roles';

// Shown by ability; the server leaves the outbox out in production, where it does not exist.
const adminLinks = [
  { action: 'team:manage', to: paths.team(), label: 'Team' },
  { action: 'fixity:run', to: paths.fixity(), label: 'Fixity' },
  { action: 'outbox:read', to: paths.outbox(), label: 'Outbox' },
] as const;

export function UserMenu() {
  const me = useMe();
  const logout = useLogout();
  const navigate = useNavigate();
  if (me.isPending) return null;
  if (!me.data)
    return (
      <Link to={paths.signIn()} className="rounded-md border border-rule-strong px-3 py-1.5 text-sm hover:bg-paper">
        Sign in
      </Link>
    );
  const { user, abilities } = me.data;
  return (
    <div className="flex items-center gap-3 text-sm">
      {adminLinks.some((l) => abilities[l.action]) ? (
        <nav aria-label="Administration" className="flex gap-3">
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
