import { useId, type ReactNode } from 'react';

export interface SectionProps {
  title: string;
  description?: ReactNode;
  actions?: ReactNode;
  children: ReactNode;
}

/** A titled region of a page; its heading labels it for assistive tech. */
export function Section({ title, description, actions, children }: SectionProps) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="space-y-3">
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <div>
          <h2 id={headingId} className="text-title">
            {title}
          </h2>
          {description ? <p className="mt-0.5 text-small text-ink-faint">{description}</p> : null}
        </div>
        {actions ? <div className="flex items-center gap-2">{actions}</div> : null}
      </div>
      {children}
    </section>
  );
}
