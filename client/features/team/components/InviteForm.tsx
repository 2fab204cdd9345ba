import { formatDate } from '../../../../shared/format';
import { type FormEvent } from 'react';
import { inviteSchema } from '../../../../shared/schemas/team';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { Select } from '../../../components/form/Select';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useInvite } from '../api';
import { roleLabel, roleOptions } from '../roles';

export function InviteForm() {
  const invite = useInvite();
  const { formRef, errors, check, fromServer } = useFormErrors();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const data = check(inviteSchema, Object.fromEntries(new FormData(form)));
    if (!data) return;
    try {
      await invite.mutateAsync(data);
      form.reset();
    } catch (err) {
      fromServer(err);
    }
  }

  const sent = invite.data?.invitation;
  return (
    <form
      ref={formRef}
      onSubmit={onSubmit}
      noValidate
      className="rounded-lg border border-rule bg-sheet p-4 space-y-3"
      aria-labelledby="invite-heading"
    >
      <h2 id="invite-heading" className="text-lg font-semibold">
        Invite someone
      </h2>
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-start">
        <Field label="E-mail" name="email" type="email" required error={errors.email} />
        <Select label="Role" name="role" defaultValue="researcher" options={roleOptions} error={errors.role} />
        <Button type="submit" disabled={invite.isPending} className="sm:mt-6">
          {invite.isPending ? 'Sending…' : 'Send invitation'}
        </Button>
      </div>
      <FormAlert message={formMessage(invite.error)} />
      {sent && !invite.error ? (
        <FormAlert
          tone="ok"
          message={`Invitation sent to ${sent.email} as ${roleLabel[sent.role]}; the link works once until ${formatDate(sent.expiresAt)}.`}
        />
      ) : null}
    </form>
  );
}
