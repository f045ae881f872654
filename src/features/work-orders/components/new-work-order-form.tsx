import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { ProblemNote } from '@/components/ui/problem-note';
import { TextField } from '@/components/ui/text-field';
import { useClientOrganisations } from '@/features/work-orders/api/get-client-organisations';
import { useCreateWorkOrder } from '@/features/work-orders/api/create-work-order';
import type { WorkOrderDetail } from '@shared/schemas/work-orders';
import { DECISION_RULE_CHOICES } from '@/features/work-orders/components/decision-rule-words';
import { TextAreaField } from '@/components/ui/text-area-field';
import { ChoiceField, SelectField } from '@/features/work-orders/components/form-controls';
import { splitServerProblems } from '@/lib/server-problems';
import { createWorkOrderRequest, EMPTY_WORK_ORDER_DRAFT, type FieldProblems, type WorkOrderDraft } from '@/features/work-orders/lib/work-order-request';

export interface NewWorkOrderFormProps {
  todayIsoDate: string;
  onCreated: (workOrder: WorkOrderDetail) => void;
  onCancel: () => void;
}

/** Opens a work order for a client; the server allocates its number (WO-YYYY-NNNN). */
export function NewWorkOrderForm({ todayIsoDate, onCreated, onCancel }: NewWorkOrderFormProps) {
  const organisations = useClientOrganisations();
  const create = useCreateWorkOrder({ onCreated });
  const [draft, setDraft] = useState<WorkOrderDraft>({ ...EMPTY_WORK_ORDER_DRAFT });
  const [localProblems, setLocalProblems] = useState<FieldProblems>({});

  const server = splitServerProblems(create.error, ['organisationId', 'title', 'clientReference', 'dueDate', 'decisionRule', 'notes']);
  const problems: FieldProblems = { ...server.byField, ...localProblems };
  const unplacedServerMessage = server.leftOver;

  const set = <Key extends keyof WorkOrderDraft>(key: Key, value: WorkOrderDraft[Key]) => {
    setDraft((current) => ({ ...current, [key]: value }));
    setLocalProblems((current) => ({ ...current, [key]: undefined }));
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const outcome = createWorkOrderRequest(draft, { todayIsoDate });
    if (!outcome.ok) {
      setLocalProblems(outcome.problems);
      return;
    }
    setLocalProblems({});
    create.mutate(outcome.request);
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-4 rounded-sheet border border-rule-strong bg-sheet px-5 py-4 shadow-sheet" aria-label="New work order">
      <div className="flex items-baseline justify-between gap-3 border-b border-rule pb-2">
        <h2 className="text-title-sm">New work order</h2>
        <p className="text-caption text-ink-faint">The number is given when it is saved.</p>
      </div>
      <div className="grid gap-4 md:grid-cols-2">
        <SelectField
          label="Client organisation"
          value={draft.organisationId}
          onChange={(event) => set('organisationId', event.target.value)}
          error={problems.organisationId}
          disabled={organisations.isPending}
          hint={organisations.isError ? `The list of clients could not be loaded: ${organisations.error.message}` : undefined}
        >
          <option value="">{organisations.isPending ? 'Loading clients…' : 'Choose a client…'}</option>
          {(organisations.data ?? []).map((organisation) => (
            <option key={organisation.id} value={organisation.id}>
              {organisation.name}
            </option>
          ))}
        </SelectField>
        <TextField label="Title" value={draft.title} onChange={(event) => set('title', event.target.value)} error={problems.title} placeholder="e.g. Incoming inspection, batch of plano-convex lenses" />
        <TextField
          label="Client reference (optional)"
          value={draft.clientReference}
          onChange={(event) => set('clientReference', event.target.value)}
          error={problems.clientReference}
          hint="The client’s own order or purchase number."
        />
        <TextField
          label="Due date (optional)"
          type="date"
          className="[&_input]:numerals"
          value={draft.dueDate}
          min={todayIsoDate}
          onChange={(event) => set('dueDate', event.target.value)}
          error={problems.dueDate}
          hint="When the client expects the certificates."
        />
      </div>
      <ChoiceField
        legend="Decision rule for conformity"
        name="decisionRule"
        value={draft.decisionRule}
        options={DECISION_RULE_CHOICES}
        onChange={(value) => set('decisionRule', value)}
        error={problems.decisionRule}
      />
      <TextAreaField label="Notes (optional)" value={draft.notes} onChange={(event) => set('notes', event.target.value)} error={problems.notes} rows={3} />
      {unplacedServerMessage ? <ProblemNote title="The work order was not saved" message={unplacedServerMessage} /> : null}
      <div className="flex items-center justify-end gap-2 border-t border-rule pt-3">
        <Button variant="quiet" onClick={onCancel} disabled={create.isPending}>
          Cancel
        </Button>
        <Button type="submit" isBusy={create.isPending}>
          Open work order
        </Button>
      </div>
    </form>
  );
}
