import { useId, type ReactNode, type SelectHTMLAttributes } from 'react';
import { FieldFrame, FieldProblem, fieldBorder, fieldDescribedBy } from '@/components/ui/field-frame';

export interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> {
  label: string;
  error?: string;
  hint?: string;
  children: ReactNode;
}

/** A labelled select that looks like TextField and shows the server's sentence under it. */
export function SelectField({ label, error, hint, className = '', children, ...selectProps }: SelectFieldProps) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={fieldDescribedBy(id, hint, error)}
        className={`h-10 rounded-sheet border bg-sheet px-2.5 text-body text-ink disabled:bg-shade ${fieldBorder(error)}`}
        {...selectProps}
      >
        {children}
      </select>
    </FieldFrame>
  );
}

export interface ChoiceOption<Value extends string> {
  value: Value;
  label: string;
  /** One line saying what choosing it means. */
  explanation: string;
}

export interface ChoiceFieldProps<Value extends string> {
  legend: string;
  name: string;
  value: Value;
  options: ChoiceOption<Value>[];
  onChange: (value: Value) => void;
  error?: string;
}

/** Radio choices laid out as small cards, each with a line of explanation. */
export function ChoiceField<Value extends string>({ legend, name, value, options, onChange, error }: ChoiceFieldProps<Value>) {
  const id = useId();
  return (
    <fieldset className="flex flex-col gap-1.5" aria-describedby={error ? `${id}-error` : undefined}>
      <legend className="mb-1.5 text-small font-medium text-ink">{legend}</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {options.map((option) => {
          const checked = option.value === value;
          return (
            <label
              key={option.value}
              className={`flex cursor-pointer gap-2.5 rounded-sheet border px-3 py-2 ${
                checked ? 'border-ink bg-sheet shadow-sheet' : 'border-rule-strong bg-paper/60 hover:bg-sheet'
              }`}
            >
              <input
                type="radio"
                name={name}
                value={option.value}
                checked={checked}
                onChange={() => onChange(option.value)}
                className="mt-1 accent-[var(--color-ink)]"
              />
              <span>
                <span className="block text-small font-semibold text-ink">{option.label}</span>
                <span className="block text-caption text-ink-soft">{option.explanation}</span>
              </span>
            </label>
          );
        })}
      </div>
      {error ? <FieldProblem id={`${id}-error`} message={error} /> : null}
    </fieldset>
  );
}
