import { useId, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { FieldProblem } from '@/components/ui/field-frame';
import { ProblemNote } from '@/components/ui/problem-note';
import { TextField } from '@/components/ui/text-field';
import { useCreateEquipment } from '@/features/equipment/api/create-equipment';
import { equipmentKinds, type EquipmentItem, type EquipmentKindName } from '@shared/schemas/equipment';
import { useUpdateEquipment } from '@/features/equipment/api/update-equipment';
import { splitServerProblems } from '@/lib/server-problems';
import {
  createEquipmentRequest,
  emptyEquipmentDraft,
  equipmentDraftFrom,
  updateEquipmentRequest,
  valueProblemKey,
  type EquipmentDraft,
  type FieldProblems,
} from '@/features/equipment/lib/equipment-request';
import { EQUIPMENT_KIND_WORDS, EQUIPMENT_VALUE_FIELDS, type ValueField } from '@/features/equipment/lib/equipment-value-fields';

function ValueInput({ field, value, onChange, error }: { field: ValueField; value: string; onChange: (text: string) => void; error?: string }) {
  const id = useId();
  const label = `${field.label}${field.required ? '' : ' (optional)'}`;
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="text-small font-medium text-ink">
        {label}
      </label>
      {field.type === 'choice' ? (
        <select
          id={id}
          value={value}
          onChange={(event) => onChange(event.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          className={`h-10 rounded-sheet border bg-sheet px-2.5 text-body text-ink ${error ? 'border-nonconform' : 'border-rule-strong'}`}
        >
          <option value="">{field.required ? 'Choose…' : 'Not recorded'}</option>
          {field.choices.map((choice) => (
            <option key={choice.value} value={choice.value}>
              {choice.label}
            </option>
          ))}
        </select>
      ) : (
        <div className={`flex h-10 items-center rounded-sheet border bg-sheet ${error ? 'border-nonconform' : 'border-rule-strong'}`}>
          <input
            id={id}
            inputMode="decimal"
            autoComplete="off"
            value={value}
            placeholder={field.placeholder}
            onChange={(event) => onChange(event.target.value)}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? `${id}-error` : undefined}
            className="numerals h-full min-w-0 flex-1 rounded-sheet bg-transparent px-3 text-right text-body text-ink placeholder:text-ink-faint/60"
          />
          <span className="w-9 pr-3 text-right font-light text-ink-faint">{field.unit}</span>
        </div>
      )}
      {error ? <FieldProblem id={`${id}-error`} message={error} /> : null}
    </div>
  );
}

export interface EquipmentFormProps {
  /** The item to edit; absent to add a new one. */
  editing?: EquipmentItem;
  /** The kind a new item starts as. */
  initialKind?: EquipmentKindName;
  onDone: (item: EquipmentItem) => void;
  onCancel: () => void;
}

export function EquipmentForm({ editing, initialKind = 'camera', onDone, onCancel }: EquipmentFormProps) {
  const kindId = useId();
  const [draft, setDraft] = useState<EquipmentDraft>(() => (editing ? equipmentDraftFrom(editing) : emptyEquipmentDraft(initialKind)));
  const [localProblems, setLocalProblems] = useState<FieldProblems>({});
  const create = useCreateEquipment({ onCreated: onDone });
  const update = useUpdateEquipment({ onUpdated: onDone });
  const mutation = editing ? update : create;
  const [nothingChanged, setNothingChanged] = useState(false);

  const server = splitServerProblems(mutation.error, [
    'identifier',
    'description',
    'serialNumber',
    'calibrationReference',
    'calibrationDueDate',
    'values',
    ...EQUIPMENT_VALUE_FIELDS[draft.kind].map((field) => valueProblemKey(field.key)),
  ]);
  const problems: FieldProblems = { ...server.byField, ...localProblems };
  const unplacedServerMessage = server.leftOver;

  const clear = (...keys: string[]) => {
    setNothingChanged(false);
    setLocalProblems((current) => ({ ...current, ...Object.fromEntries(keys.map((key) => [key, undefined])) }));
  };
  const setField = (key: 'identifier' | 'description' | 'serialNumber' | 'calibrationReference' | 'calibrationDueDate', value: string) => {
    setDraft((current) => ({ ...current, [key]: value }));
    clear(key);
  };
  const setValue = (key: string, value: string) => {
    setDraft((current) => ({ ...current, values: { ...current.values, [key]: value } }));
    clear(valueProblemKey(key), 'values');
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (editing) {
      const outcome = updateEquipmentRequest(editing, draft);
      if (!outcome.ok) return setLocalProblems(outcome.problems);
      if (Object.keys(outcome.request).length === 0) return setNothingChanged(true);
      setLocalProblems({});
      update.mutate({ equipmentId: editing.id, request: outcome.request });
    } else {
      const outcome = createEquipmentRequest(draft);
      if (!outcome.ok) return setLocalProblems(outcome.problems);
      setLocalProblems({});
      create.mutate(outcome.request);
    }
  };

  const words = EQUIPMENT_KIND_WORDS[draft.kind];
  return (
    <form onSubmit={submit} noValidate aria-label={editing ? `Edit ${editing.identifier}` : 'Add equipment'} className="space-y-4 rounded-sheet border border-rule-strong bg-sheet px-5 py-4 shadow-sheet">
      <div className="flex flex-wrap items-baseline justify-between gap-3 border-b border-rule pb-2">
        <h2 className="text-title-sm">
          {editing ? (
            <>
              Edit {words.one.toLowerCase()} <span className="numerals">{editing.identifier}</span>
            </>
          ) : (
            'Add equipment'
          )}
        </h2>
        <p className="text-caption text-ink-faint">Uncertainties are standard uncertainties (k = 1), as the calibration certificate states them.</p>
      </div>
      <div className="grid gap-4 md:grid-cols-4">
        {editing ? (
          <div className="flex flex-col gap-1.5">
            <p className="text-small font-medium text-ink">Kind</p>
            <p className="flex h-10 items-center text-body text-ink-soft">{words.one}</p>
          </div>
        ) : (
          <div className="flex flex-col gap-1.5">
            <label htmlFor={kindId} className="text-small font-medium text-ink">
              Kind
            </label>
            <select
              id={kindId}
              value={draft.kind}
              onChange={(event) => {
                const kind = event.target.value as EquipmentKindName;
                setDraft((current) => ({ ...emptyEquipmentDraft(kind), identifier: current.identifier, description: current.description, serialNumber: current.serialNumber, calibrationReference: current.calibrationReference, calibrationDueDate: current.calibrationDueDate }));
                setLocalProblems({});
              }}
              className="h-10 rounded-sheet border border-rule-strong bg-sheet px-2.5 text-body text-ink"
            >
              {equipmentKinds.map((kind) => (
                <option key={kind} value={kind}>
                  {EQUIPMENT_KIND_WORDS[kind].one}
                </option>
              ))}
            </select>
          </div>
        )}
        <TextField label="Identifier" className="[&_input]:numerals" value={draft.identifier} onChange={(event) => setField('identifier', event.target.value)} error={problems.identifier} placeholder="e.g. CAM-03" />
        <TextField label="Serial number (optional)" className="[&_input]:numerals" value={draft.serialNumber} onChange={(event) => setField('serialNumber', event.target.value)} error={problems.serialNumber} />
        <TextField label="Description (optional)" value={draft.description} onChange={(event) => setField('description', event.target.value)} error={problems.description} />
      </div>
      <fieldset className="rounded-sheet border border-rule bg-paper/50 px-4 pb-4 pt-2">
        <legend className="px-1 text-caption font-semibold uppercase tracking-wider text-ink-faint">{words.one} values</legend>
        <div className="grid gap-4 md:grid-cols-4">
          {EQUIPMENT_VALUE_FIELDS[draft.kind].map((field) => (
            <ValueInput key={field.key} field={field} value={draft.values[field.key] ?? ''} onChange={(text) => setValue(field.key, text)} error={problems[valueProblemKey(field.key)]} />
          ))}
        </div>
        {problems.values ? <div className="mt-3"><FieldProblem id={`${kindId}-values`} message={problems.values} /></div> : null}
      </fieldset>
      <div className="grid gap-4 md:grid-cols-4">
        <TextField
          label="Calibration reference"
          className="md:col-span-2"
          value={draft.calibrationReference}
          onChange={(event) => setField('calibrationReference', event.target.value)}
          error={problems.calibrationReference}
          placeholder="e.g. certificate no. and issuing laboratory"
        />
        <TextField
          label="Calibration due"
          type="date"
          className="[&_input]:numerals"
          value={draft.calibrationDueDate}
          onChange={(event) => setField('calibrationDueDate', event.target.value)}
          error={problems.calibrationDueDate}
        />
      </div>
      {unplacedServerMessage ? <ProblemNote title={editing ? 'The changes were not saved' : 'The item was not added'} message={unplacedServerMessage} /> : null}
      {nothingChanged ? <p role="status" className="text-small text-ink-soft">Nothing has changed yet, so there is nothing to save.</p> : null}
      <div className="flex items-center justify-end gap-2 border-t border-rule pt-3">
        <Button variant="quiet" onClick={onCancel} disabled={mutation.isPending}>
          Cancel
        </Button>
        <Button type="submit" isBusy={mutation.isPending}>
          {editing ? 'Save changes' : 'Add to register'}
        </Button>
      </div>
    </form>
  );
}
