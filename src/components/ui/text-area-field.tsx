import { useId, type TextareaHTMLAttributes } from 'react';
import { FieldFrame, fieldBorder, fieldDescribedBy } from '@/components/ui/field-frame';

export interface TextAreaFieldProps extends Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'id'> {
  label: string;
  error?: string;
  hint?: string;
}

/** A labelled text area that looks like TextField and shows the server's sentence under it. */
export function TextAreaField({ label, error, hint, className = '', ...areaProps }: TextAreaFieldProps) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      <textarea
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={fieldDescribedBy(id, hint, error)}
        className={`min-h-20 rounded-sheet border bg-sheet px-3 py-2 text-body text-ink placeholder:text-ink-faint/70 ${fieldBorder(error)}`}
        {...areaProps}
      />
    </FieldFrame>
  );
}
