import type { ReactNode } from 'react';

export interface PageHeaderProps {
  /** Small line above the title, e.g. the organisation or the stage of the work. */
  kicker?: ReactNode;
  title: string;
  children?: ReactNode;
  actions?: ReactNode;
}

export function PageHeader({ kicker, title, children, actions }: PageHeaderProps) {
  return (
    <header className="flex flex-wrap items-end justify-between gap-4 border-b border-rule pb-4">
      <div className="max-w-measure">
        {kicker ? <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">{kicker}</p> : null}
        <h1 className="mt-1 text-title-lg">{title}</h1>
        {children ? <div className="mt-2 text-body text-ink-soft">{children}</div> : null}
      </div>
      {actions ? <div className="flex items-center gap-2">{actions}</div> : null}
    </header>
  );
}
