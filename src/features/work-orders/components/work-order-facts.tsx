import type { ReactNode } from 'react';
import type { WorkOrderDetail } from '@shared/schemas/work-orders';
import { DECISION_RULE_SHORT } from '@/features/work-orders/components/decision-rule-words';
import { DueDateText } from '@/features/work-orders/components/due-date-text';
import { WorkOrderStatusMark } from '@/features/work-orders/components/work-order-status-mark';
import { localIsoDate } from '@/features/work-orders/lib/work-order-due';

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="min-w-0 border-l border-rule pl-3">
      <dt className="text-caption font-semibold uppercase tracking-wider text-ink-faint">{term}</dt>
      <dd className="mt-0.5 text-body text-ink">{children}</dd>
    </div>
  );
}

/** The facts of a work order in one ruled strip under its title. */
export function WorkOrderFacts({ workOrder, todayIsoDate }: { workOrder: WorkOrderDetail; todayIsoDate: string }) {
  return (
    <dl className="grid gap-x-4 gap-y-3 sm:grid-cols-2 lg:grid-cols-5">
      <Fact term="Client">{workOrder.organisation.name}</Fact>
      <Fact term="Status">
        <WorkOrderStatusMark status={workOrder.status} />
      </Fact>
      <Fact term="Due">
        <DueDateText dueDate={workOrder.dueDate} status={workOrder.status} todayIsoDate={todayIsoDate} />
      </Fact>
      <Fact term="Decision rule">{DECISION_RULE_SHORT[workOrder.decisionRule]}</Fact>
      <Fact term="Client reference">{workOrder.clientReference ? <span className="numerals">{workOrder.clientReference}</span> : <span className="text-ink-faint">none</span>}</Fact>
      <Fact term="Opened">
        <span className="numerals">{localIsoDate(new Date(workOrder.createdAt))}</span>
        {workOrder.createdBy ? <span className="text-ink-soft"> by {workOrder.createdBy.name}</span> : null}
      </Fact>
      <Fact term="Lenses">
        <span className="numerals">{workOrder.lenses.length}</span>
        <span className="text-ink-soft">
          {' '}
          · <span className="numerals">{workOrder.measurementCount}</span> measurements
        </span>
      </Fact>
      {workOrder.notes ? (
        <div className="min-w-0 border-l border-rule pl-3 sm:col-span-2 lg:col-span-3">
          <dt className="text-caption font-semibold uppercase tracking-wider text-ink-faint">Notes</dt>
          <dd className="mt-0.5 whitespace-pre-line text-small text-ink-soft">{workOrder.notes}</dd>
        </div>
      ) : null}
    </dl>
  );
}
