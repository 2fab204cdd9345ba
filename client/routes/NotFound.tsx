import { Link, isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { paths } from '../paths';

export function NotFound({ title = 'Not found', text = 'There is nothing at this address, or you may not see it.' }: { title?: string; text?: string }) {
  return (
    <div className="py-16 max-w-xl">
      <h1 className="text-3xl font-semibold">{title}</h1>
      <p className="mt-2 text-ink-soft">{text}</p>
      <Link className="mt-6 inline-block text-action underline" to={paths.home()}>
        Back to the start
      </Link>
    </div>
  );
}

export function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFound />;
  return <NotFound title="Something went wrong" text={error instanceof Error ? error.message : 'An unexpected error stopped this page.'} />;
}
