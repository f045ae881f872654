import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { ParaxiaWordmark } from '@/components/layouts/paraxia-wordmark';
import { ProblemNote } from '@/components/ui/problem-note';

/** Last resort for a route that threw while loading or rendering outside any region boundary. */
export function RouteErrorPage() {
  const error = useRouteError();
  console.error('[paraxia] route failed', error);
  const message = isRouteErrorResponse(error)
    ? `The page answered ${error.status} ${error.statusText}.`
    : 'Something went wrong while opening this page. Reload it; if it happens again, tell your administrator what you were doing.';
  return (
    <main className="mx-auto flex min-h-dvh max-w-lg flex-col justify-center gap-6 px-6">
      <title>Problem · Paraxia</title>
      <ParaxiaWordmark />
      <ProblemNote title="This page could not be opened" message={message} />
      <Link to="/" className="text-body font-medium underline underline-offset-4">
        Go to your home page
      </Link>
    </main>
  );
}
