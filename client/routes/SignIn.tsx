import { useDocumentTitle } from '../lib/title';
import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { loginSchema } from '../../shared/schemas/auth';
import { Button } from '../components/Button';
import { Field } from '../components/form/Field';
import { useLogin } from '../features/auth/api';
import { ApiError } from '../lib/http';
import { paths } from '../paths';

// Only a path inside the app, never another site (//host or a full URL).
const safeNext = (next: string | null) => (next && next.startsWith('/') && !next.startsWith('//') ? next : paths.home());

export function SignIn() {
  useDocumentTitle('Sign in');
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const login = useLogin();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = Object.fromEntries(new FormData(e.currentTarget));
    const parsed = loginSchema.safeParse(form);
    if (!parsed.success) {
      setFieldErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), [i.message]])));
      return;
    }
    setFieldErrors({});
    try {
      await login.mutateAsync(parsed.data);
      navigate(safeNext(params.get('next')), { replace: true });
    } catch (err) {
      if (err instanceof ApiError && err.details?.fields) setFieldErrors(err.details.fields);
    }
  }

  const formError = login.error instanceof ApiError && !login.error.details?.fields ? login.error.message : null;
  return (
    <div className="mx-auto max-w-sm py-10">
      <h1 className="text-3xl font-semibold">Sign in</h1>
      <p className="mt-1 text-sm text-ink-soft">Visitors can browse published pieces without signing in.</p>
      <form className="mt-6 space-y-4" onSubmit={onSubmit} noValidate>
        <Field label="E-mail" name="email" type="email" autoComplete="username" required error={fieldErrors.email} />
        <Field label="Password" name="password" type="password" autoComplete="current-password" required error={fieldErrors.password} />
        {formError ? (
          <p role="alert" className="rounded-md bg-danger-tint px-3 py-2 text-sm text-danger">
            {formError}
          </p>
        ) : null}
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
