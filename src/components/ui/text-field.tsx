import { forwardRef, useId, type InputHTMLAttributes } from 'react';
import { SquareCrossGlyph } from '@/components/ui/mark-glyphs';

export interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> {
  label: string;
  /** A sentence naming what is wrong with this field; shown under it and announced. */
  error?: string;
  hint?: string;
}

export const TextField = forwardRef<HTMLInputElement, TextFieldProps>(function TextField(
  { label, error, hint, className = '', ...inputProps },
  ref,
) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`flex flex-col gap-1.5 ${className}`}>
      <label htmlFor={id} className="text-small font-medium text-ink">
        {label}
      </label>
      {hint ? (
        <p id={hintId} className="text-caption text-ink-faint">
          {hint}
        </p>
      ) : null}
      <input
        ref={ref}
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`h-10 rounded-sheet border bg-sheet px-3 text-body text-ink placeholder:text-ink-faint/70 disabled:bg-shade disabled:text-ink-soft ${
          error ? 'border-nonconform' : 'border-rule-strong'
        }`}
        {...inputProps}
      />
      {error ? (
        <p id={errorId} className="flex items-start gap-1.5 text-small text-nonconform">
          <SquareCrossGlyph className="mt-[0.2em] size-3.5 shrink-0" />
          {error}
        </p>
      ) : null}
    </div>
  );
});
