import { type FormEvent } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { acceptInvitationSchema } from '../../shared/schemas/team';
import { Button } from '../components/Button';
import { Field } from '../components/form/Field';
import { FormAlert } from '../components/form/FormAlert';
import { useAcceptInvitation, useInvitation } from '../features/invitations/api';
import { roleLabel } from '../features/team/roles';
import { ApiError } from '../lib/http';
import { formMessage, useFormErrors } from '../lib/form';
import { paths } from '../paths';
import { NotFound } from './NotFound';

export function JoinTeam() {
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
  if (invitation.error) {
    const spent = invitation.error instanceof ApiError && invitation.error.status === 410;
    return <NotFound title={spent ? 'This invitation can no longer be used' : 'Invitation not found'} text={`${invitation.error.message} An admin can send you a new invitation.`} />;
  }
  const { email, role, expiresAt } = invitation.data.invitation;
  return (
    <div className="mx-auto max-w-sm py-10">
      <h1 className="text-3xl font-semibold">Join the team</h1>
      <p className="mt-1 text-sm text-ink-soft">
        You are invited as <strong>{roleLabel[role]}</strong> with the address <span className="font-mono">{email}</span>. Choose the name others will see and a
        password. The link expires on <time dateTime={expiresAt}>{new Date(expiresAt).toLocaleString()}</time>.
      </p>
      <form ref={formRef} className="mt-6 space-y-4" onSubmit={onSubmit} noValidate>
        <Field label="Your name" name="name" autoComplete="name" required error={errors.name} />
        <Field label="Password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={errors.password} />
        <FormAlert message={formMessage(accept.error)} />
        <Button type="submit" disabled={accept.isPending} className="w-full">
          {accept.isPending ? 'Joining…' : 'Join Tinctoria'}
        </Button>
      </form>
    </div>
  );
}
