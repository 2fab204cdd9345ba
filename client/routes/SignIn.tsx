import { useDocumentTitle } from '../lib/title';
import { type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { loginSchema } from '../../shared/schemas/auth';
import { Button } from '../components/Button';
import { Field } from '../components/form/Field';
import { useLogin } from '../features/auth/api';
import { FormAlert } from '../components/form/FormAlert';
import { formMessage, useFormErrors } from '../lib/form';
import { paths } from '../paths';

// Only a path inside the app, never another site (//host or a full URL).
const safeNext = (next: string | null) =>
  next && next.startsWith('/') && !next.startsWith('//') ? next : paths.home();

export function SignIn() {
  useDocumentTitle('Sign in');
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const login = useLogin();
  const { formRef, errors: fieldErrors, check, fromServer } = useFormErrors();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = check(loginSchema, Object.fromEntries(new FormData(e.currentTarget)));
    if (!data) return;
    try {
      await login.mutateAsync(data);
      navigate(safeNext(params.get('next')), { replace: true });
    } catch (err) {
      fromServer(err);
    }
  }

  const formError = formMessage(login.error);
  return (
    <div className="mx-auto max-w-sm py-10">
      <h1 className="text-3xl font-semibold">Sign in</h1>
      <p className="mt-1 text-sm text-ink-soft">Visitors can browse published pieces without signing in.</p>
      <form ref={formRef} className="mt-6 space-y-4" onSubmit={onSubmit} noValidate>
        <Field label="E-mail" name="email" type="email" autoComplete="username" required error={fieldErrors.email} />
        <Field
          label="Password"
          name="password"
          type="password"
          autoComplete="current-password"
          required
          error={fieldErrors.password}
        />
        <FormAlert message={formError} />
        <Button type="submit" disabled={login.isPending} className="w-full">
          {login.isPending ? 'Signing in…' : 'Sign in'}
        </Button>
      </form>
      <p className="mt-4 text-sm">
        <Link to={paths.forgotPassword()} className="text-action underline">
          Forgotten your password?
        </Link>
      </p>
    </div>
  );
}
