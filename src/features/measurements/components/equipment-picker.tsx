import { useId } from 'react';
import type { EquipmentItem } from '@shared/schemas/equipment';
import type { EquipmentRole } from '@shared/schemas/measurements';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { useEquipmentOfKind } from '@/features/measurements/api/get-equipment-for-role';
import { CalibrationMark } from '@/features/measurements/components/calibration-mark';
import { FieldProblem } from '@/components/ui/field-frame';
import { equipmentValuesText } from '@/features/measurements/utils/equipment-values-text';
import { EQUIPMENT_ROLE_WORDS } from '@/features/measurements/utils/method-requirements';

export interface EquipmentPickerProps {
  role: EquipmentRole;
  selectedId: string | undefined;
  onSelect: (item: EquipmentItem) => void;
  overrideReason: string;
  onOverrideReasonChange: (reason: string) => void;
  error?: string;
  overrideError?: string;
}

/**
 * The register's active items of one kind as a radio list, each with the
 * values the analysis will use and its calibration state. Choosing an
 * overdue item opens a box for the reason it is used anyway.
 */
export function EquipmentPicker({
  role,
  selectedId,
  onSelect,
  overrideReason,
  onOverrideReasonChange,
  error,
  overrideError,
}: EquipmentPickerProps) {
  const name = useId();
  const items = useEquipmentOfKind(role);
  const roleWord = EQUIPMENT_ROLE_WORDS[role];
  const selected = items.data?.find((item) => item.id === selectedId);

  return (
    <fieldset className="space-y-1.5" data-field={`equipment-${role}`} aria-describedby={error ? `${name}-error` : undefined}>
      <legend className="text-small font-semibold text-ink">{roleWord}</legend>
      {items.isPending ? <LoadingNote what={`${roleWord.toLowerCase()}s from the equipment register`} /> : null}
      {items.isError ? (
        <ProblemNote
          title={`The ${roleWord.toLowerCase()}s could not be loaded`}
          message={items.error.message}
          action={
            <Button variant="secondary" size="sm" onClick={() => items.refetch()} isBusy={items.isFetching}>
              Try again
            </Button>
          }
        />
      ) : null}
      {items.data && items.data.length === 0 ? (
        <p className="rounded-sheet border border-dashed border-rule-strong px-3 py-2 text-small text-ink-soft">
          The equipment register holds no active {roleWord.toLowerCase()}. An administrator adds one under Equipment.
        </p>
      ) : null}
      {items.data && items.data.length > 0 ? (
        <div
          className={`divide-y divide-rule overflow-hidden rounded-sheet border bg-sheet ${error ? 'border-nonconform' : 'border-rule'}`}
          role="radiogroup"
          aria-label={roleWord}
        >
          {items.data.map((item) => {
            const checked = item.id === selectedId;
            return (
              <label
                key={item.id}
                className={`grid cursor-pointer grid-cols-[auto_minmax(0,1fr)_auto] items-baseline gap-x-3 px-3 py-2 ${checked ? 'bg-shade/80' : 'hover:bg-shade/40'}`}
                data-equipment={item.identifier}
              >
                <input
                  type="radio"
                  name={name}
                  checked={checked}
                  onChange={() => onSelect(item)}
                  className="size-4 translate-y-0.5 accent-[var(--color-ink)]"
                />
                <span className="min-w-0">
                  <span className="numerals text-small font-semibold text-ink">{item.identifier}</span>
                  {item.description ? <span className="ml-2 text-small text-ink-soft">{item.description}</span> : null}
                  <span className="block text-caption text-ink-faint">
                    <span className="tabular-nums">{equipmentValuesText(item)}</span>
                    <span> · cal. ref. </span>
                    <span className="numerals">{item.calibrationReference}</span>
                  </span>
                </span>
                <CalibrationMark item={item} />
              </label>
            );
          })}
        </div>
      ) : null}
      {error ? <FieldProblem id={`${name}-error`} message={error} /> : null}
      {selected?.calibrationState === 'overdue' ? (
        <div className="space-y-1.5 rounded-sheet border border-nonconform/40 bg-nonconform-tint/40 px-3 py-2.5" data-role="override">
          <label htmlFor={`${name}-override`} className="block text-small font-semibold text-ink">
            Why may {selected.identifier} be used past its calibration due date?
          </label>
          <p id={`${name}-override-hint`} className="text-caption text-ink-soft">
            Its calibration ran out on {selected.calibrationDueDate}. The reason is recorded with your name beside this measurement, and the
            reviewer and the certificate’s equipment list show it — e.g. “checked against reference scale RS-01 today, within 0.01 mm”.
          </p>
          <textarea
            id={`${name}-override`}
            value={overrideReason}
            onChange={(event) => onOverrideReasonChange(event.target.value)}
            rows={2}
            aria-invalid={overrideError ? true : undefined}
            aria-describedby={`${name}-override-hint`}
            className={`w-full rounded-sheet border bg-sheet px-3 py-2 text-body text-ink ${overrideError ? 'border-nonconform' : 'border-rule-strong'}`}
          />
          {overrideError ? <FieldProblem message={overrideError} /> : null}
        </div>
      ) : null}
    </fieldset>
  );
}
