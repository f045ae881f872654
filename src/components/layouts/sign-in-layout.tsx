import type { ReactNode } from 'react';
import { ConvergingLensIllustration } from '@/components/illustrations/converging-lens';
import { ParaxiaWordmark } from '@/components/layouts/paraxia-wordmark';

/** A notebook spread: the left page on measurement grid, the right page holds the form. */
export function SignInLayout({ children }: { children: ReactNode }) {
  return (
    <div className="grid min-h-dvh lg:grid-cols-[minmax(0,1.1fr)_minmax(26rem,1fr)]">
      <section
        aria-label="About Paraxia"
        className="plot-grid relative hidden flex-col justify-between border-r border-rule px-12 py-10 lg:flex"
      >
        <ParaxiaWordmark size="lg" />
        <div className="max-w-lg">
          <div className="rounded-sheet border border-rule bg-sheet/90 p-6 text-ink-soft shadow-sheet">
            <ConvergingLensIllustration />
          </div>
          <p className="mt-8 font-serif text-title-lg text-ink">Focal length, measured through focus and certified.</p>
          <p className="mt-3 text-lead text-ink-soft">
            Upload a through-focus series from the bench. Paraxia finds best focus and magnification, states the focal
            length with its uncertainty budget, routes it through review, and issues a certificate your client can check.
          </p>
        </div>
        <p className="text-caption text-ink-faint">Paraxia · for optical test labs</p>
      </section>
      <section className="flex flex-col justify-center bg-paper px-6 py-10 sm:px-12">
        <div className="mx-auto w-full max-w-sm">
          <div className="mb-8 lg:hidden">
            <ParaxiaWordmark size="lg" />
          </div>
          {children}
        </div>
      </section>
    </div>
  );
}
