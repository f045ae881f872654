import { useId, useState } from 'react';
import { FILTER_CONTROL_CLASS } from '@/components/ui/filter-field';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { Section } from '@/components/ui/section';
import { equipmentKinds, type EquipmentItem, type EquipmentKindName } from '@shared/schemas/equipment';
import { useEquipment } from '@/features/equipment/api/get-equipment';
import { useUpdateEquipment } from '@/features/equipment/api/update-equipment';
import { CalibrationStateMark } from '@/features/equipment/components/calibration-state-mark';
import { EquipmentForm } from '@/features/equipment/components/equipment-form';
import { EquipmentKindTable } from '@/features/equipment/components/equipment-kind-table';
import { DUE_SOON_DAYS } from '@/features/equipment/lib/calibration-due';
import { EQUIPMENT_KIND_WORDS } from '@/features/equipment/lib/equipment-value-fields';
import { filterRegister, summariseRegister } from '@/features/equipment/lib/summarise-register';

type FormState = { mode: 'closed' } | { mode: 'add'; kind: EquipmentKindName } | { mode: 'edit'; item: EquipmentItem };

export interface EquipmentRegisterProps {
  /** Administrators add, edit and retire; everyone else reads. */
  canAdminister: boolean;
  todayIsoDate: string;
}

export function EquipmentRegister({ canAdminister, todayIsoDate }: EquipmentRegisterProps) {
  const searchId = useId();
  const retiredId = useId();
  const [includeInactive, setIncludeInactive] = useState(false);
  const [query, setQuery] = useState('');
  const [form, setForm] = useState<FormState>({ mode: 'closed' });
  const [confirmingRetireId, setConfirmingRetireId] = useState<string | null>(null);
  const [lastSaved, setLastSaved] = useState<string | null>(null);
  const equipment = useEquipment({ includeInactive });
  const status = useUpdateEquipment({ onUpdated: () => setConfirmingRetireId(null) });

  if (equipment.isPending) return <LoadingNote what="the equipment register" />;
  if (equipment.isError) {
    return (
      <ProblemNote
        title="The equipment register could not be loaded"
        message={equipment.error.message}
        action={
          <Button variant="secondary" size="sm" onClick={() => equipment.refetch()} isBusy={equipment.isFetching}>
            Load again
          </Button>
        }
      />
    );
  }

  const summary = summariseRegister(equipment.data);
  const shown = summariseRegister(filterRegister(equipment.data, query));
  const actions = canAdminister
    ? {
        onEdit: (item: EquipmentItem) => {
          setConfirmingRetireId(null);
          setForm({ mode: 'edit', item });
        },
        onRetire: (item: EquipmentItem) => {
          if (confirmingRetireId !== item.id) return setConfirmingRetireId(item.id);
          status.mutate({ equipmentId: item.id, request: { active: false } });
        },
        onReturnToService: (item: EquipmentItem) => status.mutate({ equipmentId: item.id, request: { active: true } }),
        confirmingRetireId,
        onCancelRetire: () => setConfirmingRetireId(null),
        busyId: status.isPending ? (status.variables?.equipmentId ?? null) : null,
      }
    : undefined;
  const closeForm = (saved?: EquipmentItem) => {
    setForm({ mode: 'closed' });
    if (saved) setLastSaved(`${EQUIPMENT_KIND_WORDS[saved.kind].one} ${saved.identifier} is saved in the register.`);
  };

  return (
    <div className="space-y-8">
      <div className="space-y-3">
        <dl className="flex flex-wrap items-center gap-x-6 gap-y-2 rounded-sheet border border-rule bg-sheet px-4 py-2.5 text-small" aria-label="Calibration at a glance">
          <div className="flex items-baseline gap-1.5">
            <dt className="text-ink-soft">In service</dt>
            <dd className="numerals text-lead text-ink">{summary.inService}</dd>
          </div>
          <div className="flex items-center gap-1.5">
            <dt className="sr-only">Current</dt>
            <dd className="flex items-center gap-1.5">
              <CalibrationStateMark due={{ state: 'current', daysLeft: DUE_SOON_DAYS + 1, text: 'Current' }} />
              <span className="numerals text-ink">{summary.byState.current}</span>
            </dd>
          </div>
          <div className="flex items-center gap-1.5">
            <dt className="sr-only">Due within {DUE_SOON_DAYS} days</dt>
            <dd className="flex items-center gap-1.5">
              <CalibrationStateMark due={{ state: 'due-soon', daysLeft: 1, text: `Due within ${DUE_SOON_DAYS} days` }} />
              <span className="numerals text-ink">{summary.byState['due-soon']}</span>
            </dd>
          </div>
          <div className="flex items-center gap-1.5">
            <dt className="sr-only">Overdue</dt>
            <dd className="flex items-center gap-1.5">
              <CalibrationStateMark due={{ state: 'overdue', daysLeft: 0, text: 'Overdue' }} />
              <span className="numerals text-ink">{summary.byState.overdue}</span>
            </dd>
          </div>
          {summary.byState.overdue > 0 ? (
            <p className="basis-full text-caption text-ink-soft">
              Overdue items cannot be chosen for a measurement without a reason recorded for a reviewer to see.
            </p>
          ) : null}
        </dl>
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div className="flex flex-wrap items-center gap-4">
            <div className="flex items-center gap-2">
              <label htmlFor={searchId} className="text-small text-ink-soft">
                Find
              </label>
              <input
                id={searchId}
                type="search"
                value={query}
                onChange={(event) => setQuery(event.target.value)}
                placeholder="identifier, serial, certificate…"
                className={`${FILTER_CONTROL_CLASS} w-64`}
              />
            </div>
            <label htmlFor={retiredId} className="flex items-center gap-2 text-small text-ink-soft">
              <input id={retiredId} type="checkbox" checked={includeInactive} onChange={(event) => setIncludeInactive(event.target.checked)} className="accent-[var(--color-ink)]" />
              Show retired items
            </label>
          </div>
          {canAdminister && form.mode === 'closed' ? (
            <Button
              onClick={() => {
                setLastSaved(null);
                setForm({ mode: 'add', kind: 'camera' });
              }}
            >
              Add equipment
            </Button>
          ) : null}
        </div>
        {lastSaved ? (
          <p role="status" className="text-small text-ink-soft">
            {lastSaved}
          </p>
        ) : null}
        {status.error ? <ProblemNote title="The item’s service state did not change" message={status.error.message} /> : null}
        {form.mode === 'add' ? <EquipmentForm initialKind={form.kind} onDone={closeForm} onCancel={() => closeForm()} /> : null}
      </div>

      {equipmentKinds.map((kind) => {
        const words = EQUIPMENT_KIND_WORDS[kind];
        const items = shown.byKind[kind];
        if (query.trim() !== '' && items.length === 0) return null;
        return (
          <Section
            key={kind}
            title={words.many}
            description={words.about}
            actions={<span className="numerals text-small text-ink-faint">{items.length}</span>}
          >
            {form.mode === 'edit' && form.item.kind === kind ? (
              <EquipmentForm key={form.item.id} editing={form.item} onDone={closeForm} onCancel={() => closeForm()} />
            ) : null}
            <EquipmentKindTable kind={kind} items={items} todayIsoDate={todayIsoDate} actions={actions} />
          </Section>
        );
      })}
      {query.trim() !== '' && equipmentKinds.every((kind) => shown.byKind[kind].length === 0) ? (
        <p className="rounded-sheet border border-dashed border-rule-strong bg-sheet/70 px-4 py-3 text-small text-ink-soft">
          Nothing in the register matches “{query.trim()}”{includeInactive ? '' : ' (retired items are hidden)'}.
        </p>
      ) : null}
    </div>
  );
}
