import { useDocumentTitle } from '../lib/title';
import { type FormEvent } from 'react';
import { Link, useParams } from 'react-router-dom';
import { resetPasswordSchema } from '../../shared/schemas/team';
import { Button } from '../components/Button';
import { Field } from '../components/form/Field';
import { FormAlert } from '../components/form/FormAlert';
import { useResetLink, useResetPassword } from '../features/auth/api';
import { formMessage, useFormErrors } from '../lib/form';
import { paths } from '../paths';

export function ResetPassword() {
  useDocumentTitle('Choose a new password');
  const { token = '' } = useParams();
  const reset = useResetPassword(token);
  const link = useResetLink(token);
  const { formRef, errors, check, fromServer } = useFormErrors();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = check(resetPasswordSchema, Object.fromEntries(new FormData(e.currentTarget)));
    if (!data) return;
    await reset.mutateAsync(data).catch((err) => fromServer(err));
  }

  if (link.isPending) return <p className="py-10 text-ink-soft">Checking the link…</p>;
  if (link.error && !reset.isSuccess)
    return (
      <div className="mx-auto max-w-md py-10 space-y-4" data-testid="spent-reset-link">
        <h1 className="text-3xl font-semibold">This link no longer works</h1>
        <p className="text-ink-soft">{link.error.message}</p>
        <p className="flex flex-wrap gap-4 text-sm">
          <Link to={paths.forgotPassword()} className="text-action underline">
            Ask for a new link
          </Link>
          <Link to={paths.signIn()} className="text-action underline">
            Sign in
          </Link>
        </p>
      </div>
    );
  return (
    <div className="mx-auto max-w-sm py-10">
      <h1 className="text-3xl font-semibold">Choose a new password</h1>
      {reset.isSuccess ? (
        <div className="mt-6 space-y-4">
          <FormAlert tone="ok" message="Your password is changed, and every other session of yours has ended." />
          <Link to={paths.signIn()} className="text-action underline text-sm">
            Sign in with the new password
          </Link>
        </div>
      ) : (
        <form ref={formRef} className="mt-6 space-y-4" onSubmit={onSubmit} noValidate>
          <Field
            label="New password"
            name="password"
            type="password"
            autoComplete="new-password"
            required
            hint="At least 10 characters."
            error={errors.password}
          />
          <FormAlert message={formMessage(reset.error)} />
          {reset.error && !errors.password ? (
            <Link to={paths.forgotPassword()} className="block text-action underline text-sm">
              Ask for a new link
            </Link>
          ) : null}
          <Button type="submit" disabled={reset.isPending} className="w-full">
            {reset.isPending ? 'Saving…' : 'Save the new password'}
          </Button>
        </form>
      )}
    </div>
  );
}
