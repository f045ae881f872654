import { forwardRef, useId, type InputHTMLAttributes } from 'react';
import { FieldFrame, fieldBorder, fieldDescribedBy } from '@/components/ui/field-frame';

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
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      <input
        ref={ref}
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={fieldDescribedBy(id, hint, error)}
        className={`h-10 rounded-sheet border bg-sheet px-3 text-body text-ink placeholder:text-ink-faint/70 disabled:bg-shade disabled:text-ink-soft ${fieldBorder(error)}`}
        {...inputProps}
      />
    </FieldFrame>
  );
});
