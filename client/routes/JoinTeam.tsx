import { useDocumentTitle } from '../lib/title';
import { formatDateTime } from '../../shared/format';
import { type FormEvent } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { acceptInvitationSchema } from '../../shared/schemas/team';
import { Button } from '../components/Button';
import { Field } from '../components/form/Field';
import { FormAlert } from '../components/form/FormAlert';
import { useAcceptInvitation, useInvitation } from '../features/invitations/api';
import { roleLabel } from '../features/team/roles';
import { ApiError } from '../lib/http';
import { formMessage, useFormErrors } from '../lib/form';
import { paths } from '../paths';

export function JoinTeam() {
  useDocumentTitle('Join the team');
  const { token = '' } = useParams();
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation(token);
  const navigate = useNavigate();
  const { formRef, errors, check, fromServer } = useFormErrors();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = check(acceptInvitationSchema, Object.fromEntries(new FormData(e.currentTarget)));
    if (!data) return;
    try {
      await accept.mutateAsync(data);
      navigate(paths.home(), { replace: true });
    } catch (err) {
      fromServer(err);
    }
  }

  if (invitation.isPending) return <p className="py-10 text-ink-soft">Checking the invitation…</p>;
  if (invitation.error) return <SpentInvitation error={invitation.error} />;
  const { email, role, expiresAt } = invitation.data.invitation;
  return (
    <div className="mx-auto max-w-sm py-10">
      <h1 className="text-3xl font-semibold">Join the team</h1>
      <p className="mt-1 text-sm text-ink-soft">
        You are invited as <strong>{roleLabel[role]}</strong> with the address{' '}
        <span className="font-mono">{email}</span>. Choose the name others will see and a password. The link expires on{' '}
        <time dateTime={expiresAt}>{formatDateTime(expiresAt)}</time>.
      </p>
      <form ref={formRef} className="mt-6 space-y-4" onSubmit={onSubmit} noValidate>
        <Field label="Your name" name="name" autoComplete="name" required error={errors.name} />
        <Field
          label="Password"
          name="password"
          type="password"
          autoComplete="new-password"
          required
          hint="At least 10 characters."
          error={errors.password}
        />
        <FormAlert message={formMessage(accept.error)} />
        <Button type="submit" disabled={accept.isPending} className="w-full">
          {accept.isPending ? 'Joining…' : 'Join Tinctoria'}
        </Button>
      </form>
    </div>
  );
}

const SPENT_TITLES: Record<string, string> = {
  joined: 'You have already joined',
  replaced: 'A newer invitation was sent',
  withdrawn: 'This invitation was withdrawn',
  expired: 'This invitation has expired',
};

/** A link that no longer works says why, and offers what can be done: sign in, or ask for a new invitation. */
function SpentInvitation({ error }: { error: Error }) {
  const reason = error instanceof ApiError && typeof error.details?.reason === 'string' ? error.details.reason : null;
  const title = (reason && SPENT_TITLES[reason]) ?? 'This invitation link is not valid';
  const text =
    error instanceof ApiError && error.status !== 404
      ? error.message
      : 'The link may have been copied incompletely. Open it again from the e-mail, or ask an admin to send a new invitation.';
  return (
    <div className="mx-auto max-w-md py-10 space-y-4" data-testid="spent-invitation">
      <h1 className="text-3xl font-semibold">{title}</h1>
      <p className="text-ink-soft">{text}</p>
      <p className="flex flex-wrap gap-4 text-sm">
        <Link to={paths.signIn()} className="text-action underline">
          Sign in
        </Link>
        {reason === 'joined' ? (
          <Link to={paths.forgotPassword()} className="text-action underline">
            Forgot your password?
          </Link>
        ) : null}
      </p>
    </div>
  );
}
