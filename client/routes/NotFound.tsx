import { useDocumentTitle } from '../lib/title';
import { Link, isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { ApiError } from '../lib/http';
import { paths } from '../paths';

export function NotFound({
  title = 'Not found',
  text = 'There is nothing at this address, or you may not see it.',
}: {
  title?: string;
  text?: string;
}) {
  useDocumentTitle(title);
  return (
    <div className="py-16 max-w-xl">
      <p className="font-mono text-sm text-ink-faint">404</p>
      <h1 className="text-3xl font-semibold">{title}</h1>
      <p className="mt-2 text-ink-soft">{text}</p>
      <Link className="mt-6 inline-block text-action underline" to={paths.home()}>
        Back to the start
      </Link>
    </div>
  );
}

/** A signed-in user whose role does not allow this page. */
export function Forbidden({
  text = 'Your role does not include this part of Tinctoria. An admin can change your role on the team page.',
}: {
  text?: string;
}) {
  useDocumentTitle('Not allowed');
  return (
    <div className="py-16 max-w-xl">
      <p className="font-mono text-sm text-ink-faint">403</p>
      <h1 className="text-3xl font-semibold">Not allowed</h1>
      <p className="mt-2 text-ink-soft">{text}</p>
      <Link className="mt-6 inline-block text-action underline" to={paths.home()}>
        Back to the start
      </Link>
    </div>
  );
}

export function RouteError() {
  const error = useRouteError();
  if ((isRouteErrorResponse(error) || error instanceof ApiError) && error.status === 404) return <NotFound />;
  if ((isRouteErrorResponse(error) || error instanceof ApiError) && error.status === 403) return <Forbidden />;
  return (
    <NotFound
      title="Something went wrong"
      text={error instanceof Error ? error.message : 'An unexpected error stopped this page.'}
    />
  );
}
