import { Link } from 'react-router-dom';
import { Page } from '../components/Page';
import { useMe } from '../features/auth/api';
import { InviteForm } from '../features/team/components/InviteForm';
import { PendingInvitations } from '../features/team/components/PendingInvitations';
import { TeamTable } from '../features/team/components/TeamTable';
import { useTeam } from '../features/team/api';
import { paths } from '../paths';

export function Team() {
  const team = useTeam();
  const me = useMe().data;
  return (
    <Page
      title="Team"
      lead="Invite people by e-mail with a role, send or withdraw pending invitations, change roles, and deactivate accounts. Deactivating someone signs them out everywhere at once."
      actions={
        <Link to={paths.outbox()} className="rounded-md border border-rule-strong px-3 py-1.5 text-sm hover:bg-paper">
          Local outbox
        </Link>
      }
    >
      <div className="space-y-6">
        <InviteForm />
        <PendingInvitations />
        {team.isPending ? <p className="text-ink-soft">Loading the team…</p> : null}
        {team.error ? (
          <p role="alert" className="text-danger">
            {team.error.message}
          </p>
        ) : null}
        {team.data && me ? (
          <>
            <TeamTable members={team.data.items} meId={me.user.id} />
            <p className="text-xs text-ink-faint num">
              {team.data.total} {team.data.total === 1 ? 'member' : 'members'}
            </p>
          </>
        ) : null}
      </div>
    </Page>
  );
}
