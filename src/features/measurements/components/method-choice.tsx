import { useId } from 'react';
import type { MeasurementMethod } from '@shared/measure/types';
import { FieldProblem } from '@/components/ui/field-frame';
import { methodRequirements, METHODS_IN_OFFER_ORDER } from '@/features/measurements/utils/method-requirements';

export interface MethodChoiceProps {
  value: MeasurementMethod;
  onChange: (method: MeasurementMethod) => void;
  /** The method the lens most likely needs; marked "suggested". */
  suggested: MeasurementMethod;
  error?: string;
}

/** The five methods as a radio list, each with one plain sentence of what happens on the bench. */
export function MethodChoice({ value, onChange, suggested, error }: MethodChoiceProps) {
  const name = useId();
  const errorId = `${name}-error`;
  return (
    <fieldset aria-describedby={error ? errorId : undefined} data-field="method">
      <legend className="sr-only">Method</legend>
      <div className="divide-y divide-rule overflow-hidden rounded-sheet border border-rule bg-sheet">
        {METHODS_IN_OFFER_ORDER.map((method) => {
          const requirements = methodRequirements(method);
          const checked = method === value;
          return (
            <label
              key={method}
              className={`flex cursor-pointer gap-3 px-4 py-2.5 ${checked ? 'bg-shade/80' : 'hover:bg-shade/40'}`}
              data-method={method}
            >
              <input
                type="radio"
                name={name}
                value={method}
                checked={checked}
                onChange={() => onChange(method)}
                className="mt-1 size-4 shrink-0 accent-[var(--color-ink)]"
              />
              <span className="min-w-0">
                <span className="flex flex-wrap items-baseline gap-x-2">
                  <span className={`text-body ${checked ? 'font-semibold text-ink' : 'font-medium text-ink'}`}>{requirements.name}</span>
                  {method === suggested ? (
                    <span className="rounded-hair border border-rule-strong px-1 text-caption text-ink-soft">suggested for this lens</span>
                  ) : null}
                  <span className="text-caption text-ink-faint">
                    {requirements.moving === 'sensor' ? 'sensor moves' : 'lens moves'}
                    {requirements.minimumSweeps > 1 ? ` · ${requirements.minimumSweeps}+ sweeps` : ''}
                  </span>
                </span>
                <span className="mt-0.5 block text-small text-ink-soft">{requirements.explanation}</span>
              </span>
            </label>
          );
        })}
      </div>
      {error ? <FieldProblem id={errorId} message={error} className="mt-1.5" /> : null}
    </fieldset>
  );
}
