import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { ProblemNote } from '@/components/ui/problem-note';
import { TextField } from '@/components/ui/text-field';
import { useUpdateWorkOrder } from '@/features/work-orders/api/update-work-order';
import { workOrderStatuses, type WorkOrderDetail, type WorkOrderStatus } from '@shared/schemas/work-orders';
import { SelectField } from '@/features/work-orders/components/form-controls';
import { WORK_ORDER_STATUS_WORDS } from '@/features/work-orders/components/work-order-status-mark';
import { splitServerProblems } from '@/lib/server-problems';
import { updateWorkOrderProgressRequest, type FieldProblems } from '@/features/work-orders/lib/work-order-request';

export interface WorkOrderProgressFormProps {
  workOrder: WorkOrderDetail;
  onDone: () => void;
}

/** Moves a work order along (status) or changes when it is due. */
export function WorkOrderProgressForm({ workOrder, onDone }: WorkOrderProgressFormProps) {
  const [status, setStatus] = useState<WorkOrderStatus>(workOrder.status);
  const [dueDate, setDueDate] = useState(workOrder.dueDate ?? '');
  const [localProblems, setLocalProblems] = useState<FieldProblems>({});
  const update = useUpdateWorkOrder(workOrder.id, { onUpdated: onDone });
  const server = splitServerProblems(update.error, ['status', 'dueDate']);
  const problems: FieldProblems = { ...server.byField, ...localProblems };
  const unplaced = server.leftOver;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const outcome = updateWorkOrderProgressRequest(workOrder, { status, dueDate });
    if (!outcome.ok) return setLocalProblems(outcome.problems);
    if (Object.keys(outcome.request).length === 0) return onDone();
    setLocalProblems({});
    update.mutate(outcome.request);
  };

  return (
    <form onSubmit={submit} noValidate aria-label="Change status or due date" className="flex flex-wrap items-start gap-4 rounded-sheet border border-rule-strong bg-sheet px-4 py-3 shadow-sheet">
      <SelectField
        label="Status"
        value={status}
        onChange={(event) => {
          setStatus(event.target.value as WorkOrderStatus);
          setLocalProblems((current) => ({ ...current, status: undefined }));
        }}
        error={problems.status}
        className="w-48"
      >
        {workOrderStatuses.map((value) => (
          <option key={value} value={value}>
            {WORK_ORDER_STATUS_WORDS[value]}
          </option>
        ))}
      </SelectField>
      <TextField
        label="Due date"
        type="date"
        className="w-48 [&_input]:numerals"
        value={dueDate}
        onChange={(event) => {
          setDueDate(event.target.value);
          setLocalProblems((current) => ({ ...current, dueDate: undefined }));
        }}
        error={problems.dueDate}
      />
      <p className="max-w-56 self-end pb-1 text-caption text-ink-faint">Empty the due date to remove it. Completed and cancelled orders are never shown as late.</p>
      <div className="ml-auto flex items-center gap-2 self-end">
        <Button type="submit" isBusy={update.isPending}>
          Save
        </Button>
        <Button variant="quiet" onClick={onDone} disabled={update.isPending}>
          Cancel
        </Button>
      </div>
      {unplaced ? (
        <div className="basis-full">
          <ProblemNote title="The work order was not changed" message={unplaced} />
        </div>
      ) : null}
    </form>
  );
}
