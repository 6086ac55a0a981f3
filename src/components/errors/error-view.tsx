import { isRouteErrorResponse, Link, useRouteError } from 'react-router';

export function ErrorView({ title, message }: { title: string; message: string }) {
  return (
    <div className="mx-auto max-w-xl py-16 text-center">
      <h1 className="text-2xl font-semibold">{title}</h1>
      <p className="mt-3 text-ink-soft">{message}</p>
      <Link to="/" className="mt-6 inline-flex min-h-touch items-center rounded-lg bg-brand px-4 font-medium text-white">
        Back to the start page
      </Link>
    </div>
  );
}

/** Route-level error boundary: a page that broke does not take the whole app down. */
export function RouteErrorBoundary() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) {
    return <ErrorView title="Page not found" message="There is nothing at this address." />;
  }
  const message = error instanceof Error ? error.message : 'Something went wrong while showing this page.';
  return <ErrorView title="This page could not be shown" message={message} />;
}
