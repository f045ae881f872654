import type { ReactNode } from 'react';
import { SquareCrossGlyph } from '@/components/ui/mark-glyphs';

/** The ids a control points its aria-describedby at: its hint and its problem, when shown. */
export function fieldDescribedBy(id: string, hint?: string, error?: string): string | undefined {
  return [hint ? `${id}-hint` : '', error ? `${id}-error` : ''].filter(Boolean).join(' ') || undefined;
}

/** The border a field's control takes: the non-conform colour while it has a problem. */
export function fieldBorder(error?: string): string {
  return error ? 'border-nonconform' : 'border-rule-strong';
}

/** The sentence naming what is wrong with a field, with the non-conform mark; `id` is what the control's aria-describedby names. */
export function FieldProblem({ id, message, className = '' }: { id?: string; message: string; className?: string }) {
  return (
    <p id={id} className={`flex items-start gap-1.5 text-small text-nonconform ${className}`}>
      <SquareCrossGlyph className="mt-[0.2em] size-3.5 shrink-0" />
      {message}
    </p>
  );
}

/** A form field's label, hint and problem sentence around its control (which carries `id`). */
export function FieldFrame({ id, label, hint, error, className = '', children }: { id: string; label: string; hint?: string; error?: string; className?: string; children: ReactNode }) {
  return (
    <div className={`flex flex-col gap-1.5 ${className}`}>
      <label htmlFor={id} className="text-small font-medium text-ink">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-caption text-ink-faint">
          {hint}
        </p>
      ) : null}
      {children}
      {error ? <FieldProblem id={`${id}-error`} message={error} /> : null}
    </div>
  );
}
