import type { ReactNode } from 'react';

export interface EmptyStateProps {
  illustration: ReactNode;
  title: string;
  children: ReactNode;
  /** Optional list of what will appear here once there is data. */
  willShow?: string[];
}

/** A deliberate "nothing here yet": a drawing, a sentence of why, and what will come. */
export function EmptyState({ illustration, title, children, willShow }: EmptyStateProps) {
  return (
    <div className="grid items-center gap-6 rounded-sheet border border-dashed border-rule-strong bg-sheet/70 px-6 py-8 sm:grid-cols-[minmax(10rem,14rem)_1fr]">
      <div className="mx-auto w-full max-w-56 text-ink-soft">{illustration}</div>
      <div className="max-w-measure">
        <h3 className="text-title-sm">{title}</h3>
        <div className="mt-2 space-y-2 text-body text-ink-soft">{children}</div>
        {willShow && willShow.length > 0 ? (
          <>
            <p className="mt-4 text-caption font-semibold uppercase tracking-wider text-ink-faint">What will appear here</p>
            <ul className="mt-1.5 space-y-1 text-small text-ink-soft">
              {willShow.map((item) => (
                <li key={item} className="flex gap-2">
                  <span aria-hidden="true" className="mt-[0.55em] h-px w-3 shrink-0 bg-ink-faint" />
                  {item}
                </li>
              ))}
            </ul>
          </>
        ) : null}
      </div>
    </div>
  );
}
