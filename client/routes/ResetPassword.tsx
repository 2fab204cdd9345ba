import { type FormEvent } from 'react';
import { Link, useParams } from 'react-router-dom';
import { resetPasswordSchema } from '../../shared/schemas/team';
import { Button } from '../components/Button';
import { Field } from '../components/form/Field';
import { FormAlert } from '../components/form/FormAlert';
import { useResetPassword } from '../features/auth/api';
import { formMessage, useFormErrors } from '../lib/form';
import { paths } from '../paths';

export function ResetPassword() {
  const { token = '' } = useParams();
  const reset = useResetPassword(token);
  const { formRef, errors, check, fromServer } = useFormErrors();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = check(resetPasswordSchema, Object.fromEntries(new FormData(e.currentTarget)));
    if (!data) return;
    await reset.mutateAsync(data).catch((err) => fromServer(err));
  }

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
          <Field label="New password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={errors.password} />
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
