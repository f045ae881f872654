import { useMemo, useState, type FormEvent } from 'react';
import type { EquipmentItem } from '@shared/schemas/equipment';
import type { LensDetail } from '@shared/schemas/lenses';
import type { EquipmentRole, MeasurementDetail } from '@shared/schemas/measurements';
import { Button } from '@/components/ui/button';
import { ProblemNote } from '@/components/ui/problem-note';
import { SafetyNote } from '@/components/ui/safety-note';
import { Section } from '@/components/ui/section';
import { TextField } from '@/components/ui/text-field';
import { isApiError } from '@/lib/api-client';
import { useCreateMeasurement } from '@/features/measurements/api/create-measurement';
import { BenchDiagram } from '@/features/measurements/components/bench-diagram';
import { EquipmentPicker } from '@/features/measurements/components/equipment-picker';
import { LensSummaryCard } from '@/features/measurements/components/lens-summary-card';
import { MethodChoice } from '@/features/measurements/components/method-choice';
import { SweepSetupFields } from '@/features/measurements/components/sweep-setup-fields';
import {
  buildCreateMeasurementRequest,
  emptyNewMeasurementDraft,
  overrideFieldKey,
  sweepFieldKey,
  sweepsForMethod,
  type NewMeasurementDraft,
} from '@/features/measurements/utils/build-create-measurement-request';
import { placeServerFieldErrors } from '@/features/measurements/utils/form-field-errors';
import { EQUIPMENT_FIELD_BY_ROLE, methodRequirements, suggestedMethodFor } from '@/features/measurements/utils/method-requirements';

export interface NewMeasurementFormProps {
  lens: LensDetail;
  onCreated: (measurement: MeasurementDetail) => void;
  onCancel: () => void;
}

function todayIsoDate(): string {
  const now = new Date();
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}


/**
 * The set-up of a new measurement of one lens: method, the equipment each
 * role needs (with an override reason for anything overdue), environment,
 * sweeps and their fixed rail readings. Checks locally first, then shows
 * the server's sentences beside the same fields.
 */
export function NewMeasurementForm({ lens, onCreated, onCancel }: NewMeasurementFormProps) {
  const suggested = suggestedMethodFor(lens.kind);
  const [draft, setDraft] = useState<NewMeasurementDraft>(() => ({ ...emptyNewMeasurementDraft(suggested), measuredOn: todayIsoDate() }));
  const [chosenItems, setChosenItems] = useState<Partial<Record<EquipmentRole, EquipmentItem>>>({});
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [unplacedErrors, setUnplacedErrors] = useState<string[]>([]);
  const create = useCreateMeasurement({ onCreated });
  const requirements = methodRequirements(draft.method);

  const equipmentById = useMemo(
    () => new Map(Object.values(chosenItems).filter((item): item is EquipmentItem => item !== undefined).map((item) => [item.id, item])),
    [chosenItems],
  );

  const shownFieldKeys = useMemo(() => {
    const keys = new Set<string>(['method', 'sweeps', 'temperatureC', 'relativeHumidityPercent', 'measuredOn', 'notes']);
    for (const role of requirements.equipmentRoles) {
      keys.add(EQUIPMENT_FIELD_BY_ROLE[role]);
      keys.add(overrideFieldKey(role));
    }
    draft.sweeps.forEach((_, index) => requirements.sweepReadings.forEach((field) => keys.add(sweepFieldKey(index, field))));
    return keys;
  }, [requirements, draft.sweeps]);

  const change = (update: Partial<NewMeasurementDraft>) => setDraft((current) => ({ ...current, ...update }));

  function submit(event: FormEvent) {
    event.preventDefault();
    const check = buildCreateMeasurementRequest({ lensId: lens.id, nominalFocalLengthMm: lens.nominalFocalLengthMm, draft, equipmentById });
    if (!check.ok) {
      const placed = Object.entries(check.fields).filter(([key]) => !shownFieldKeys.has(key));
      setFieldErrors(check.fields);
      setUnplacedErrors(placed.map(([, sentence]) => sentence));
      return;
    }
    setFieldErrors({});
    setUnplacedErrors([]);
    create.mutate(check.request, {
      onError: (error) => {
        if (!isApiError(error)) return;
        const placed = placeServerFieldErrors(error.fields, check.request, shownFieldKeys);
        setFieldErrors(placed.fields);
        setUnplacedErrors(placed.unplaced);
      },
    });
  }

  const errorCount = Object.keys(fieldErrors).length;

  return (
    <form onSubmit={submit} noValidate className="space-y-8" aria-label="New measurement">
      <LensSummaryCard lens={lens} />
      <SafetyNote context="bench" />

      <Section title="Method" description="How the bench is set up and which part moves through focus.">
        <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
          <MethodChoice
            value={draft.method}
            suggested={suggested}
            error={fieldErrors.method}
            onChange={(method) => {
              change({ method, sweeps: sweepsForMethod(draft.sweeps, method) });
              setFieldErrors({});
              setUnplacedErrors([]);
            }}
          />
          <BenchDiagram method={draft.method} sweepCount={draft.sweeps.length} />
        </div>
      </Section>

      <Section
        title="Equipment"
        description="From the equipment register; the analysis uses the calibrated values shown. Items past their calibration due date need a recorded reason."
      >
        <div className="grid gap-5 lg:grid-cols-2">
          {requirements.equipmentRoles.map((role) => {
            const selectedId = draft.equipmentIds[role];
            return (
              <EquipmentPicker
                key={role}
                role={role}
                selectedId={selectedId}
                onSelect={(item) => {
                  change({ equipmentIds: { ...draft.equipmentIds, [role]: item.id } });
                  setFieldErrors(({ [EQUIPMENT_FIELD_BY_ROLE[role]]: _cleared, ...rest }) => rest);
                  setChosenItems((current) => ({ ...current, [role]: item }));
                }}
                overrideReason={selectedId ? (draft.overrideReasons[selectedId] ?? '') : ''}
                onOverrideReasonChange={(reason) => {
                  if (selectedId) change({ overrideReasons: { ...draft.overrideReasons, [selectedId]: reason } });
                }}
                error={fieldErrors[EQUIPMENT_FIELD_BY_ROLE[role]]}
                overrideError={fieldErrors[overrideFieldKey(role)]}
              />
            );
          })}
        </div>
      </Section>

      <Section title="Sweeps" description="Fixed rail readings of each sweep, in mm on the bench’s one rail scale.">
        <SweepSetupFields method={draft.method} sweeps={draft.sweeps} onChange={(sweeps) => change({ sweeps })} fieldErrors={fieldErrors} />
      </Section>

      <Section title="Conditions" description="Optional, but printed on the certificate when given.">
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField
            label="Temperature (°C)"
            inputMode="decimal"
            value={draft.temperatureC}
            onChange={(event) => change({ temperatureC: event.target.value })}
            error={fieldErrors.temperatureC}
            placeholder="e.g. 21.5"
          />
          <TextField
            label="Relative humidity (%)"
            inputMode="decimal"
            value={draft.relativeHumidityPercent}
            onChange={(event) => change({ relativeHumidityPercent: event.target.value })}
            error={fieldErrors.relativeHumidityPercent}
            placeholder="e.g. 45"
          />
          <TextField
            label="Measured on"
            type="date"
            value={draft.measuredOn}
            onChange={(event) => change({ measuredOn: event.target.value })}
            error={fieldErrors.measuredOn}
          />
        </div>
        <div className="flex flex-col gap-1.5">
          <label htmlFor="measurement-notes" className="text-small font-medium text-ink">
            Notes
          </label>
          <textarea
            id="measurement-notes"
            rows={2}
            value={draft.notes}
            onChange={(event) => change({ notes: event.target.value })}
            className="rounded-sheet border border-rule-strong bg-sheet px-3 py-2 text-body text-ink"
            placeholder="Anything a reviewer should know about this set-up"
          />
        </div>
      </Section>

      <div className="space-y-3 border-t border-rule pt-5">
        {errorCount > 0 ? (
          <ProblemNote
            title={errorCount === 1 ? 'One field needs attention' : `${errorCount} fields need attention`}
            message={
              unplacedErrors.length > 0
                ? unplacedErrors.join(' ')
                : create.error && isApiError(create.error)
                  ? create.error.message
                  : 'Each problem is named beside its field above.'
            }
          />
        ) : create.error ? (
          <ProblemNote title="The measurement was not created" message={create.error.message} />
        ) : null}
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" isBusy={create.isPending}>
            Create measurement
          </Button>
          <Button variant="quiet" onClick={onCancel}>
            Cancel
          </Button>
          <p className="text-small text-ink-faint">Next: upload each sweep’s frames and enter their rail readings.</p>
        </div>
      </div>
    </form>
  );
}
