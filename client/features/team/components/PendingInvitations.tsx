import { useState } from 'react';
import { formatDate } from '../../../../shared/format';
import { Button } from '../../../components/Button';
import { FormAlert } from '../../../components/form/FormAlert';
import { formMessage } from '../../../lib/form';
import { usePendingInvitations, useResendInvitation, useRevokeInvitation } from '../api';
import { roleLabel } from '../roles';

/** Invitations not yet accepted: send again (a new link, the old one stops working) or withdraw. */
export function PendingInvitations() {
  const list = usePendingInvitations();
  const resend = useResendInvitation();
  const revoke = useRevokeInvitation();
  const [done, setDone] = useState<string | null>(null);
  if (list.isPending) return <p className="text-ink-soft">Loading the invitations…</p>;
  if (list.error)
    return (
      <p role="alert" className="text-danger">
        {list.error.message}
      </p>
    );
  const items = list.data.items;
  return (
    <section className="space-y-3" aria-labelledby="pending-heading">
      <h2 id="pending-heading" className="font-serif text-xl">
        Pending invitations
      </h2>
      <FormAlert tone="ok" message={done} />
      <FormAlert message={formMessage(resend.error ?? revoke.error)} />
      {items.length === 0 ? (
        <p className="text-sm text-ink-soft">No invitation is waiting for an answer.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-lg border border-rule bg-sheet text-sm">
          {items.map((i) => (
            <li
              key={i.id}
              className="flex flex-wrap items-center justify-between gap-3 px-3 py-2"
              data-testid={`invitation-${i.email}`}
            >
              <div>
                <span className="font-mono">{i.email}</span> as {roleLabel[i.role]}
                <div className="text-xs text-ink-soft">
                  Sent {formatDate(i.sentAt)}
                  {i.invitedBy ? ` by ${i.invitedBy}` : ''} ·{' '}
                  {i.expired ? (
                    <strong className="text-danger">link expired {formatDate(i.expiresAt)}</strong>
                  ) : (
                    `link works until ${formatDate(i.expiresAt)}`
                  )}
                </div>
              </div>
              <div className="flex gap-2">
                <Button
                  variant="secondary"
                  disabled={resend.isPending}
                  onClick={() =>
                    resend.mutate(i.id, {
                      onSuccess: () =>
                        setDone(`A new link is on its way to ${i.email}; the earlier link no longer works.`),
                    })
                  }
                >
                  Resend
                </Button>
                <Button
                  variant="secondary"
                  disabled={revoke.isPending}
                  onClick={() =>
                    confirm(`Withdraw the invitation to ${i.email}? The link will stop working.`) &&
                    revoke.mutate(i.id, { onSuccess: () => setDone(`The invitation to ${i.email} is withdrawn.`) })
                  }
                >
                  Withdraw
                </Button>
              </div>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
