import type { MeasurementMethod } from '@shared/measure/types';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { FieldProblem } from '@/components/ui/field-frame';
import { MAXIMUM_SWEEPS, sweepFieldKey, type SweepDraft } from '@/features/measurements/utils/build-create-measurement-request';
import { methodRequirements, SWEEP_READING_WORDS } from '@/features/measurements/utils/method-requirements';

export interface SweepSetupFieldsProps {
  method: MeasurementMethod;
  sweeps: SweepDraft[];
  onChange: (sweeps: SweepDraft[]) => void;
  fieldErrors: Record<string, string>;
}

const HINTS = {
  objectPositionMm: 'Rail reading of the target plane',
  lensPositionMm: 'Rail reading of the lens carrier’s reference mark',
  sensorPositionMm: 'Rail reading of the sensor plane',
} as const;

/** How many sweeps, and the fixed rail readings each one needs for the chosen method. */
export function SweepSetupFields({ method, sweeps, onChange, fieldErrors }: SweepSetupFieldsProps) {
  const requirements = methodRequirements(method);
  const canRemove = sweeps.length > requirements.minimumSweeps;
  const canAdd = sweeps.length < MAXIMUM_SWEEPS;
  const update = (index: number, change: Partial<SweepDraft>) => onChange(sweeps.map((s, i) => (i === index ? { ...s, ...change } : s)));
  const movingWords = requirements.moving === 'sensor' ? 'the sensor' : 'the lens';

  return (
    <div className="space-y-3" data-field="sweeps">
      <div className="flex flex-wrap items-center gap-3">
        <p className="text-small text-ink-soft">
          <span className="numerals font-semibold text-ink">{sweeps.length}</span> {sweeps.length === 1 ? 'sweep' : 'sweeps'}
          {requirements.minimumSweeps > 1 ? ` (the ${requirements.name.toLowerCase()} method needs at least ${requirements.minimumSweeps})` : ''}.
          In each, {movingWords} moves and every frame gets its own rail reading after upload.
        </p>
        <div className="ml-auto flex gap-2">
          <Button
            variant="secondary"
            size="sm"
            disabled={!canRemove}
            onClick={() => onChange(sweeps.slice(0, -1))}
            aria-label="Remove the last sweep"
          >
            − Sweep
          </Button>
          <Button
            variant="secondary"
            size="sm"
            disabled={!canAdd}
            onClick={() => onChange([...sweeps, { objectPositionMm: '', lensPositionMm: '', sensorPositionMm: '' }])}
            aria-label="Add a sweep"
          >
            + Sweep
          </Button>
        </div>
      </div>
      {fieldErrors.sweeps ? <FieldProblem message={fieldErrors.sweeps} /> : null}
      <ol className="divide-y divide-rule rounded-sheet border border-rule bg-sheet">
        {sweeps.map((sweep, index) => (
          <li key={index} className="grid gap-x-4 gap-y-2 px-4 py-3 md:grid-cols-[6rem_repeat(2,minmax(0,1fr))]" data-sweep={index + 1}>
            <p className="pt-7 font-serif text-title-sm font-semibold text-ink">Sweep {index + 1}</p>
            {requirements.sweepReadings.map((field) => (
              <TextField
                key={field}
                label={`${SWEEP_READING_WORDS[field]} (mm)`}
                hint={HINTS[field]}
                inputMode="decimal"
                autoComplete="off"
                value={sweep[field]}
                onChange={(event) => update(index, { [field]: event.target.value })}
                error={fieldErrors[sweepFieldKey(index, field)]}
                data-field={sweepFieldKey(index, field)}
              />
            ))}
          </li>
        ))}
      </ol>
    </div>
  );
}
