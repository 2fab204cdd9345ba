import type { ReactNode } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import type { Action } from '../../../../shared/abilities';
import { Forbidden, NotFound } from '../../../routes/NotFound';
import { paths } from '../../../paths';
import { useMe } from '../api';

/**
 * A route guard that reads the server's abilities: visitors go to sign-in (and come
 * back afterwards), a signed-in user without the ability sees the 403 page.
 */
export function RequireAbility({ action, children }: { action: Action; children?: ReactNode }) {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <p className="py-10 text-ink-soft">Checking your access…</p>;
  if (me.isError) return <NotFound title="The server is not answering" text="Your access could not be checked. Try again in a moment." />;
  if (!me.data) return <Navigate to={paths.signIn(location.pathname + location.search)} replace />;
  if (!me.data.abilities[action]) return <Forbidden />;
  return children ?? <Outlet />;
}
