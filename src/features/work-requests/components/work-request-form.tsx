import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { ProblemNote } from '@/components/ui/problem-note';
import { TextField } from '@/components/ui/text-field';
import { lensFieldName, WORK_REQUEST_MAX_LENSES, type WorkRequestResponse } from '@shared/schemas/portal';
import { splitServerProblems } from '@/lib/server-problems';
import { useCreateWorkRequest } from '@/features/work-requests/api/create-work-request';
import {
  emptyLensDraft,
  emptyWorkRequestDraft,
  shownFieldNames,
  workRequestFromDraft,
  type FieldProblems,
  type LensDraft,
  type WorkRequestDraft,
} from '@/features/work-requests/lib/work-request-draft';

export interface WorkRequestFormProps {
  todayIsoDate: string;
  onCreated: (created: WorkRequestResponse) => void;
  onCancel: () => void;
}

function CellInput({ label, value, onChange, error, className = '', ...rest }: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  error?: string;
  className?: string;
  inputMode?: 'decimal' | 'text';
  placeholder?: string;
}) {
  return (
    <label className={`flex flex-col gap-1 ${className}`}>
      <span className="sr-only">{label}</span>
      <input
        aria-label={label}
        aria-invalid={error ? true : undefined}
        value={value}
        onChange={(event) => onChange(event.target.value)}
        className={`h-9 w-full rounded-sheet border bg-sheet px-2 text-small text-ink placeholder:text-ink-faint/70 ${error ? 'border-nonconform' : 'border-rule-strong'}`}
        {...rest}
      />
      {error ? <span className="text-caption text-nonconform">{error}</span> : null}
    </label>
  );
}

/** A request for new work: the order's facts and a table of lenses that grows a row at a time. */
export function WorkRequestForm({ todayIsoDate, onCreated, onCancel }: WorkRequestFormProps) {
  const [draft, setDraft] = useState<WorkRequestDraft>(emptyWorkRequestDraft);
  const [localProblems, setLocalProblems] = useState<FieldProblems>({});
  const create = useCreateWorkRequest({ onCreated });
  const server = splitServerProblems(create.error, shownFieldNames(draft.lenses.length));
  const problems: FieldProblems = { ...server.byField, ...localProblems };

  const setField = (key: 'title' | 'clientReference' | 'dueDate' | 'notes', value: string) => {
    setDraft((current) => ({ ...current, [key]: value }));
    setLocalProblems((current) => ({ ...current, [key]: undefined }));
  };
  const setLens = (index: number, change: Partial<LensDraft>) => {
    setDraft((current) => ({ ...current, lenses: current.lenses.map((lens, i) => (i === index ? { ...lens, ...change } : lens)) }));
    setLocalProblems((current) => Object.fromEntries(Object.entries(current).filter(([key]) => !key.startsWith(`lenses[${index}]`))));
  };
  const addLens = () => setDraft((current) => ({ ...current, lenses: [...current.lenses, emptyLensDraft()] }));
  const removeLens = (index: number) => {
    setDraft((current) => ({ ...current, lenses: current.lenses.filter((_, i) => i !== index) }));
    setLocalProblems({});
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const outcome = workRequestFromDraft(draft);
    if (!outcome.ok) {
      setLocalProblems(outcome.problems);
      return;
    }
    setLocalProblems({});
    create.mutate(outcome.request);
  };

  const lensProblem = (index: number, field: string) => problems[lensFieldName(index, field)];

  return (
    <form onSubmit={submit} noValidate aria-label="Request new work" className="space-y-5 rounded-sheet border border-rule-strong bg-sheet px-5 py-4 shadow-sheet">
      <div className="grid gap-4 md:grid-cols-2">
        <TextField label="Title" value={draft.title} onChange={(event) => setField('title', event.target.value)} error={problems.title} placeholder="e.g. Incoming inspection, spring batch" />
        <TextField
          label="Your reference (optional)"
          value={draft.clientReference}
          onChange={(event) => setField('clientReference', event.target.value)}
          error={problems.clientReference}
          hint="Your purchase order or internal number; it is printed on the certificates."
        />
        <TextField
          label="Requested due date (optional)"
          type="date"
          className="[&_input]:numerals"
          min={todayIsoDate}
          value={draft.dueDate}
          onChange={(event) => setField('dueDate', event.target.value)}
          error={problems.dueDate}
          hint="The lab confirms the date when it accepts the order."
        />
        <label className="flex flex-col gap-1.5 text-small font-medium text-ink">
          Notes for the lab (optional)
          <textarea
            value={draft.notes}
            onChange={(event) => setField('notes', event.target.value)}
            rows={3}
            className={`rounded-sheet border bg-sheet px-3 py-2 text-body font-normal text-ink ${problems.notes ? 'border-nonconform' : 'border-rule-strong'}`}
          />
          {problems.notes ? <span className="text-caption text-nonconform">{problems.notes}</span> : null}
        </label>
      </div>

      <fieldset className="space-y-2">
        <legend className="flex w-full items-baseline justify-between text-small font-medium text-ink">
          <span>Lenses to measure</span>
          <span className="text-caption font-normal text-ink-faint">
            <span className="numerals">{draft.lenses.length}</span> of at most {WORK_REQUEST_MAX_LENSES}
          </span>
        </legend>
        <div className="overflow-x-auto rounded-sheet border border-rule">
          <table className="w-full min-w-[52rem] border-collapse text-left">
            <thead>
              <tr className="bg-shade/70 text-caption font-semibold uppercase tracking-wider text-ink-faint">
                <th scope="col" className="w-8 px-2 py-1.5 text-right">#</th>
                <th scope="col" className="px-2 py-1.5">Identifier</th>
                <th scope="col" className="px-2 py-1.5">Description</th>
                <th scope="col" className="px-2 py-1.5">Nominal f (mm)</th>
                <th scope="col" className="px-2 py-1.5">Tolerance ±</th>
                <th scope="col" className="px-2 py-1.5">Part number</th>
                <th scope="col" className="px-2 py-1.5"><span className="sr-only">Remove</span></th>
              </tr>
            </thead>
            <tbody>
              {draft.lenses.map((lens, index) => (
                <tr key={lens.key} className="border-t border-rule align-top" data-lens-row={index}>
                  <td className="numerals px-2 py-2 text-right text-small text-ink-faint">{index + 1}</td>
                  <td className="px-2 py-2">
                    <CellInput label={`Lens ${index + 1} identifier`} value={lens.identifier} onChange={(value) => setLens(index, { identifier: value })} error={lensProblem(index, 'identifier')} placeholder="Serial or mark" />
                  </td>
                  <td className="px-2 py-2">
                    <CellInput label={`Lens ${index + 1} description`} value={lens.description} onChange={(value) => setLens(index, { description: value })} error={lensProblem(index, 'description')} placeholder="e.g. Plano-convex, 25 mm" />
                  </td>
                  <td className="w-32 px-2 py-2">
                    <CellInput label={`Lens ${index + 1} nominal focal length in mm`} inputMode="decimal" className="[&_input]:numerals" value={lens.nominalFocalLengthMm} onChange={(value) => setLens(index, { nominalFocalLengthMm: value })} error={lensProblem(index, 'nominalFocalLengthMm')} placeholder="100" />
                  </td>
                  <td className="w-44 px-2 py-2">
                    <div className="flex gap-1">
                      <CellInput
                        label={`Lens ${index + 1} tolerance`}
                        inputMode="decimal"
                        className="flex-1 [&_input]:numerals"
                        value={lens.toleranceValue}
                        onChange={(value) => setLens(index, { toleranceValue: value })}
                        error={lensProblem(index, lens.toleranceUnit === 'percent' ? 'tolerancePercent' : 'toleranceMm')}
                        placeholder="1"
                      />
                      <select
                        aria-label={`Lens ${index + 1} tolerance unit`}
                        value={lens.toleranceUnit}
                        onChange={(event) => setLens(index, { toleranceUnit: event.target.value as LensDraft['toleranceUnit'] })}
                        className="h-9 rounded-sheet border border-rule-strong bg-sheet px-1 text-small"
                      >
                        <option value="percent">%</option>
                        <option value="mm">mm</option>
                      </select>
                    </div>
                  </td>
                  <td className="w-36 px-2 py-2">
                    <CellInput label={`Lens ${index + 1} part number`} value={lens.partNumber} onChange={(value) => setLens(index, { partNumber: value })} error={lensProblem(index, 'partNumber')} placeholder="optional" />
                  </td>
                  <td className="px-2 py-2">
                    <Button variant="quiet" size="sm" onClick={() => removeLens(index)} disabled={draft.lenses.length === 1} aria-label={`Remove lens ${index + 1}`}>
                      Remove
                    </Button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {problems.lenses ? <p className="text-small text-nonconform">{problems.lenses}</p> : null}
        <Button variant="secondary" size="sm" onClick={addLens} disabled={draft.lenses.length >= WORK_REQUEST_MAX_LENSES}>
          + Add a lens
        </Button>
      </fieldset>

      {server.leftOver ? <ProblemNote title="The request was not sent" message={server.leftOver} /> : null}
      <div className="flex items-center justify-end gap-2 border-t border-rule pt-3">
        <Button variant="quiet" onClick={onCancel} disabled={create.isPending}>
          Cancel
        </Button>
        <Button type="submit" isBusy={create.isPending}>
          Send the request to the lab
        </Button>
      </div>
    </form>
  );
}
