import type { ReactNode } from 'react';
import { Link, Outlet, useLocation } from 'react-router-dom';
import type { Action } from '../../../../shared/abilities';
import { Forbidden, NotFound } from '../../../routes/NotFound';
import { paths } from '../../../paths';
import { useMe } from '../api';

/**
 * A route guard that reads the server's abilities: a visitor is told the page needs signing in, with a link
 * that comes back here afterwards; a signed-in user without the ability sees the 403 page.
 */
export function RequireAbility({ action, children }: { action: Action; children?: ReactNode }) {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <p className="py-10 text-ink-soft">Checking your access…</p>;
  if (me.isError)
    return (
      <NotFound title="The server is not answering" text="Your access could not be checked. Try again in a moment." />
    );
  if (!me.data) return <SignInNeeded next={location.pathname + location.search} />;
  if (!me.data.abilities[action]) return <Forbidden />;
  return children ?? <Outlet />;
}

function SignInNeeded({ next }: { next: string }) {
  return (
    <div className="py-16 max-w-xl" data-testid="sign-in-needed">
      <h1 className="text-3xl font-semibold">Sign in to open this page</h1>
      <p className="mt-2 text-ink-soft">
        This part of Tinctoria is for members of the team. Visitors can browse the published pieces in the archive,
        search them and read the reference tables without an account.
      </p>
      <p className="mt-6 flex flex-wrap gap-x-6 gap-y-2">
        <Link className="text-action underline" to={paths.signIn(next)}>
          Sign in and come back here
        </Link>
        <Link className="text-action underline" to={paths.archive()}>
          Browse the archive
        </Link>
      </p>
    </div>
  );
}
