import { useDocumentTitle } from '../lib/title';
import { type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { resetRequestSchema } from '../../shared/schemas/team';
import { Button } from '../components/Button';
import { Field } from '../components/form/Field';
import { FormAlert } from '../components/form/FormAlert';
import { useRequestPasswordReset } from '../features/auth/api';
import { formMessage, useFormErrors } from '../lib/form';
import { paths } from '../paths';

export function ForgotPassword() {
  useDocumentTitle('Reset your password');
  const request = useRequestPasswordReset();
  const { formRef, errors, check, fromServer } = useFormErrors();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = check(resetRequestSchema, Object.fromEntries(new FormData(e.currentTarget)));
    if (!data) return;
    await request.mutateAsync(data).catch((err) => fromServer(err));
  }

  return (
    <div className="mx-auto max-w-sm py-10">
      <h1 className="text-3xl font-semibold">Forgotten password</h1>
      <p className="mt-1 text-sm text-ink-soft">
        Enter the e-mail address you sign in with. If it belongs to an account, we send a link to choose a new password;
        it works once, for 2 hours.
      </p>
      {request.isSuccess ? (
        <div className="mt-6 space-y-4">
          <FormAlert tone="ok" message={request.data.message} />
          <Link to={paths.signIn()} className="text-action underline text-sm">
            Back to sign-in
          </Link>
        </div>
      ) : (
        <form ref={formRef} className="mt-6 space-y-4" onSubmit={onSubmit} noValidate>
          <Field label="E-mail" name="email" type="email" autoComplete="username" required error={errors.email} />
          <FormAlert message={formMessage(request.error)} />
          <Button type="submit" disabled={request.isPending} className="w-full">
            {request.isPending ? 'Sending…' : 'Send the link'}
          </Button>
        </form>
      )}
    </div>
  );
}
