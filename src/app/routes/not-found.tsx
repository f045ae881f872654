import { Link, useLocation } from 'react-router-dom';
import { DivergingLensIllustration } from '@/components/illustrations/diverging-lens';
import { ParaxiaWordmark } from '@/components/layouts/paraxia-wordmark';

export function NotFoundRoute() {
  const location = useLocation();
  return (
    <main className="flex min-h-dvh flex-col items-center justify-center gap-6 px-6 py-12 text-center">
      <title>Page not found · Paraxia</title>
      <ParaxiaWordmark />
      <div className="w-full max-w-xs text-ink-soft">
        <DivergingLensIllustration />
      </div>
      <div className="max-w-md">
        <p className="numerals text-caption text-ink-faint">404 · {location.pathname}</p>
        <h1 className="mt-2 text-title-lg">This page forms no real image</h1>
        <p className="mt-3 text-body text-ink-soft">
          Like rays leaving a diverging lens, this address leads nowhere you can focus on. The link may be old, or the
          page may have moved.
        </p>
      </div>
      <Link to="/" className="rounded-sheet border border-ink bg-ink px-4 py-2 text-body font-medium text-sheet hover:bg-ink-soft">
        Go to your home page
      </Link>
    </main>
  );
}
