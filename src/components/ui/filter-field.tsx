import { useId, type ReactNode } from 'react';

/** The compact control of a list's or log's filter row. */
export const FILTER_CONTROL_CLASS = 'h-8 rounded-sheet border border-rule-strong bg-sheet px-2 text-small';

/** One filter of a filter row: its label above the control, which `children` renders with the id it is given. */
export function FilterField({ label, children }: { label: string; children: (id: string) => ReactNode }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-small text-ink-soft">
        {label}
      </label>
      {children(id)}
    </div>
  );
}
