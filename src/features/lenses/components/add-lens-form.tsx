import { useId, useState, type FormEvent, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { FieldProblem } from '@/components/ui/field-frame';
import { ProblemNote } from '@/components/ui/problem-note';
import { Quantity } from '@/components/ui/quantity';
import { TextField } from '@/components/ui/text-field';
import { useCreateLens } from '@/features/lenses/api/create-lens';
import type { LensSummary } from '@shared/schemas/lenses';
import { LensKindMark } from '@/features/lenses/components/lens-kind-mark';
import { splitServerProblems } from '@/lib/server-problems';
import {
  createLensRequest,
  EMPTY_LENS_DRAFT,
  nominalField,
  previewLensDraft,
  toleranceField,
  type FieldProblems,
  type LensDraft,
} from '@/features/lenses/lib/lens-request';

interface SegmentOption<Value extends string> {
  value: Value;
  label: string;
}

/** Two or three exclusive choices drawn as one segmented control (radio buttons underneath). */
function Segmented<Value extends string>({
  name,
  label,
  value,
  options,
  onChange,
}: {
  name: string;
  label: string;
  value: Value;
  options: SegmentOption<Value>[];
  onChange: (value: Value) => void;
}) {
  return (
    <div role="radiogroup" aria-label={label} className="inline-flex rounded-sheet border border-rule-strong bg-paper p-0.5">
      {options.map((option) => (
        <label
          key={option.value}
          className={`cursor-pointer rounded-hair px-2.5 py-0.5 text-small has-[:focus-visible]:outline has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-ink ${
            option.value === value ? 'bg-ink font-medium text-sheet' : 'text-ink-soft hover:text-ink'
          }`}
        >
          <input type="radio" name={name} value={option.value} checked={option.value === value} onChange={() => onChange(option.value)} className="sr-only" />
          {option.label}
        </label>
      ))}
    </div>
  );
}

/** A number input whose unit is chosen by a segmented control above it. */
function UnitNumberField({
  label,
  unitChoice,
  value,
  onChange,
  unitSuffix,
  placeholder,
  error,
}: {
  label: string;
  unitChoice: ReactNode;
  value: string;
  onChange: (text: string) => void;
  unitSuffix: string;
  placeholder: string;
  error?: string;
}) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1.5">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <label htmlFor={id} className="text-small font-medium text-ink">
          {label}
        </label>
        {unitChoice}
      </div>
      <div className={`flex h-10 items-center rounded-sheet border bg-sheet ${error ? 'border-nonconform' : 'border-rule-strong'}`}>
        <input
          id={id}
          inputMode="decimal"
          autoComplete="off"
          value={value}
          onChange={(event) => onChange(event.target.value)}
          placeholder={placeholder}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          className="numerals h-full min-w-0 flex-1 rounded-sheet bg-transparent px-3 text-right text-body text-ink placeholder:text-ink-faint/70"
        />
        <span className="pr-3 font-light text-ink-faint">{unitSuffix}</span>
      </div>
      {error ? <FieldProblem id={`${id}-error`} message={error} /> : null}
    </div>
  );
}

export interface AddLensFormProps {
  workOrderId: string;
  onCreated: (lens: LensSummary) => void | Promise<void>;
  onCancel: () => void;
}

export function AddLensForm({ workOrderId, onCreated, onCancel }: AddLensFormProps) {
  const [draft, setDraft] = useState<LensDraft>({ ...EMPTY_LENS_DRAFT });
  const [localProblems, setLocalProblems] = useState<FieldProblems>({});
  const create = useCreateLens(workOrderId, {
    onCreated: async (lens) => {
      // Keep the units chosen: a batch of lenses is usually entered the same way.
      setDraft((current) => ({ ...EMPTY_LENS_DRAFT, nominalMode: current.nominalMode, toleranceMode: current.toleranceMode, partNumber: current.partNumber, description: current.description }));
      await onCreated(lens);
    },
  });
  const server = splitServerProblems(create.error, [
    'identifier',
    'description',
    'partNumber',
    'nominalFocalLengthMm',
    'nominalPowerDioptres',
    'tolerancePercent',
    'toleranceMm',
  ]);
  const problems: FieldProblems = { ...server.byField, ...localProblems };
  const unplacedServerMessage = server.leftOver;
  const preview = previewLensDraft(draft);

  const set = <Key extends keyof LensDraft>(key: Key, value: LensDraft[Key], clears: string[] = [key]) => {
    setDraft((current) => ({ ...current, [key]: value }));
    setLocalProblems((current) => ({ ...current, ...Object.fromEntries(clears.map((field) => [field, undefined])) }));
  };
  const nominalProblems = ['nominalFocalLengthMm', 'nominalPowerDioptres'];
  const toleranceProblems = ['tolerancePercent', 'toleranceMm'];

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const outcome = createLensRequest(draft);
    if (!outcome.ok) {
      setLocalProblems(outcome.problems);
      return;
    }
    setLocalProblems({});
    create.mutate(outcome.request);
  };

  const nominalError = problems[nominalField(draft.nominalMode)] ?? problems.nominalFocalLengthMm ?? problems.nominalPowerDioptres;
  const toleranceError = problems[toleranceField(draft.toleranceMode)] ?? problems.tolerancePercent ?? problems.toleranceMm;

  return (
    <form onSubmit={submit} noValidate aria-label="Add a lens" className="space-y-4 rounded-sheet border border-rule-strong bg-sheet px-5 py-4 shadow-sheet">
      <div className="flex items-baseline justify-between gap-3 border-b border-rule pb-2">
        <h3 className="text-title-sm">Add a lens</h3>
        <p className="text-caption text-ink-faint">A diverging lens has a negative focal length (and power).</p>
      </div>
      <div className="grid gap-4 md:grid-cols-3">
        <TextField label="Identifier or serial" className="[&_input]:numerals" value={draft.identifier} onChange={(event) => set('identifier', event.target.value)} error={problems.identifier} placeholder="e.g. PCX-100-017" />
        <TextField label="Description (optional)" value={draft.description} onChange={(event) => set('description', event.target.value)} error={problems.description} placeholder="e.g. plano-convex, N-BK7, Ø25 mm" />
        <TextField
          label="Part number (optional)"
          className="[&_input]:numerals"
          value={draft.partNumber}
          onChange={(event) => set('partNumber', event.target.value)}
          error={problems.partNumber}
          placeholder="shared by a batch, e.g. PCX-100"
        />
      </div>
      <div className="grid gap-4 md:grid-cols-3">
        <UnitNumberField
          label="Nominal"
          unitChoice={
            <Segmented
              name="nominalMode"
              label="Nominal given as"
              value={draft.nominalMode}
              options={[
                { value: 'focal-length', label: 'focal length f′' },
                { value: 'power', label: 'power P' },
              ]}
              onChange={(mode) => set('nominalMode', mode, nominalProblems)}
            />
          }
          value={draft.nominalText}
          onChange={(text) => set('nominalText', text, nominalProblems)}
          unitSuffix={draft.nominalMode === 'focal-length' ? 'mm' : 'D'}
          placeholder={draft.nominalMode === 'focal-length' ? '100' : '10'}
          error={nominalError}
        />
        <UnitNumberField
          label="Tolerance ±"
          unitChoice={
            <Segmented
              name="toleranceMode"
              label="Tolerance given in"
              value={draft.toleranceMode}
              options={[
                { value: 'percent', label: '% of f′' },
                { value: 'mm', label: 'mm' },
              ]}
              onChange={(mode) => set('toleranceMode', mode, toleranceProblems)}
            />
          }
          value={draft.toleranceText}
          onChange={(text) => set('toleranceText', text, toleranceProblems)}
          unitSuffix={draft.toleranceMode === 'percent' ? '%' : 'mm'}
          placeholder={draft.toleranceMode === 'percent' ? '1' : '0.5'}
          error={toleranceError}
        />
        <div className="flex flex-col gap-1.5" aria-live="polite">
          <p className="text-small font-medium text-ink">This lens</p>
          <div className="flex min-h-10 flex-col justify-center rounded-sheet border border-dashed border-rule-strong bg-paper/60 px-3 py-1.5 text-small">
            {preview ? (
              <>
                <span className="flex flex-wrap items-baseline gap-x-3">
                  <LensKindMark kind={preview.kind} />
                  <span>
                    <span className="font-serif italic text-ink-soft">f′</span> <Quantity value={preview.focalLengthMm} unit="mm" digits={2} />
                  </span>
                  <span>
                    <span className="font-serif italic text-ink-soft">P</span> <Quantity value={preview.powerDioptres} unit="D" digits={3} />
                  </span>
                </span>
                {preview.band ? (
                  <span className="numerals text-caption text-ink-soft">
                    <span className="font-sans">tolerance band </span>
                    {preview.band.lowerLimitMm.toFixed(3).replace('-', '\u2212')} … {preview.band.upperLimitMm.toFixed(3).replace('-', '\u2212')}
                    <span className="font-sans font-light text-ink-faint"> mm</span>
                  </span>
                ) : null}
              </>
            ) : (
              <span className="text-ink-faint">Type the nominal to see the other unit and the tolerance band.</span>
            )}
          </div>
        </div>
      </div>
      {unplacedServerMessage ? <ProblemNote title="The lens was not added" message={unplacedServerMessage} /> : null}
      {create.isSuccess && !create.isPending ? (
        <p role="status" className="text-small text-ink-soft">
          Added <span className="numerals text-ink">{create.data.identifier}</span>. The form is ready for the next lens.
        </p>
      ) : null}
      <div className="flex items-center justify-end gap-2 border-t border-rule pt-3">
        <Button variant="quiet" onClick={onCancel} disabled={create.isPending}>
          Close
        </Button>
        <Button type="submit" isBusy={create.isPending}>
          Add lens
        </Button>
      </div>
    </form>
  );
}
