import { useEffect, useState, type FormEvent } from 'react';
import { FILTER_CONTROL_CLASS, FilterField } from '@/components/ui/filter-field';
import { Button } from '@/components/ui/button';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { LoadingNote } from '@/components/ui/loading-note';
import { Pager } from '@/components/ui/pager';
import { ProblemNote } from '@/components/ui/problem-note';
import { formatDateTime } from '@/lib/format-date-time';
import type { AuditEventRow } from '@shared/schemas/admin';
import { useAuditEvents } from '@/features/admin-audit/api/get-audit-events';
import { EMPTY_AUDIT_FILTERS, summariseDetails, type AuditFilters } from '@/features/admin-audit/lib/audit-query';

const PAGE_SIZE = 50;

/** Common action families; the field also takes any other prefix. */
const ACTION_CHOICES = [
  ['', 'Any action'],
  ['auth.', 'Sign-ins and sign-outs'],
  ['auth.sign-in-failed', 'Failed sign-ins'],
  ['person.', 'People and roles'],
  ['invitation.', 'Invitations'],
  ['password-reset.', 'Password links'],
  ['organisation.', 'Organisations and contacts'],
  ['measurement.', 'Measurements'],
  ['certificate.', 'Certificates'],
  ['storage.', 'Storage and purges'],
  ['outbound-mail.', 'Outbound mail'],
  ['audit.', 'Audit exports'],
] as const;

const COLUMNS: DataTableColumn<AuditEventRow>[] = [
  { key: 'at', header: 'When', widthClass: 'w-36', cell: (event) => <span className="numerals whitespace-nowrap text-caption">{formatDateTime(event.at)}</span> },
  {
    key: 'actor',
    header: 'Who',
    widthClass: 'w-48',
    cell: (event) =>
      event.actor ? (
        <span className="flex flex-col">
          <span>{event.actor.name}</span>
          <span className="numerals block max-w-48 truncate text-caption text-ink-faint" title={event.actor.email}>{event.actor.email}</span>
        </span>
      ) : (
        <span className="italic text-ink-faint">nobody signed in</span>
      ),
  },
  { key: 'action', header: 'Did', widthClass: 'w-52', cell: (event) => <code className="numerals text-caption text-ink">{event.action}</code> },
  {
    key: 'subject',
    header: 'To',
    widthClass: 'w-48',
    cell: (event) =>
      event.subjectType ? (
        <span className="flex flex-col">
          <span>{event.subjectType}</span>
          <span className="numerals truncate text-caption text-ink-faint" title={event.subjectId ?? ''}>
            {event.subjectId ? `${event.subjectId.slice(0, 8)}…` : ''}
          </span>
        </span>
      ) : (
        <span className="text-ink-faint">—</span>
      ),
  },
  { key: 'details', header: 'Details', widthClass: 'min-w-72', cell: (event) => <span className="text-caption text-ink-soft [overflow-wrap:anywhere]">{summariseDetails(event.details) || '—'}</span> },
  { key: 'ip', header: 'From', widthClass: 'w-28', cell: (event) => <span className="numerals text-caption text-ink-faint">{event.ip ?? '—'}</span> },
];

export interface AuditLogTableProps {
  filters: AuditFilters;
  page: number;
  onChange: (filters: AuditFilters, page: number) => void;
}

export function AuditLogTable({ filters, page, onChange }: AuditLogTableProps) {
  const [draft, setDraft] = useState(filters);
  const filtersKey = JSON.stringify(filters);
  // eslint-disable-next-line react-hooks/exhaustive-deps -- the filters arrive as a new object on every render; their content is the dependency.
  useEffect(() => setDraft(filters), [filtersKey]);
  const events = useAuditEvents(filters, page, PAGE_SIZE);

  function apply(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    onChange(draft, 1);
  }
  const field = FILTER_CONTROL_CLASS;

  return (
    <div className="space-y-3">
      <form onSubmit={apply} className="flex flex-wrap items-end gap-3 rounded-sheet border border-rule bg-sheet px-3 py-3" aria-label="Filter the audit log">
        <FilterField label="Who">
          {(id) => <input id={id} type="search" className={`${field} w-48`} placeholder="name or e-mail" value={draft.actor} onChange={(e) => setDraft({ ...draft, actor: e.target.value })} />}
        </FilterField>
        <FilterField label="Did">
          {(id) => (
            <select id={id} className={field} value={draft.action} onChange={(e) => setDraft({ ...draft, action: e.target.value })}>
              {ACTION_CHOICES.map(([value, label]) => (
                <option key={value} value={value}>{label}</option>
              ))}
              {ACTION_CHOICES.some(([value]) => value === draft.action) ? null : <option value={draft.action}>{draft.action}</option>}
            </select>
          )}
        </FilterField>
        <FilterField label="To a">
          {(id) => (
            <select id={id} className={field} value={draft.subjectType} onChange={(e) => setDraft({ ...draft, subjectType: e.target.value, subjectId: '' })}>
              <option value="">Any record</option>
              {['person', 'invitation', 'organisation', 'work-order', 'measurement', 'certificate', 'outbound-mail'].map((type) => (
                <option key={type} value={type}>{type}</option>
              ))}
            </select>
          )}
        </FilterField>
        <FilterField label="From (UTC day)">
          {(id) => <input id={id} type="date" className={`${field} numerals`} value={draft.from} onChange={(e) => setDraft({ ...draft, from: e.target.value })} />}
        </FilterField>
        <FilterField label="To (UTC day)">
          {(id) => <input id={id} type="date" className={`${field} numerals`} value={draft.to} onChange={(e) => setDraft({ ...draft, to: e.target.value })} />}
        </FilterField>
        <div className="flex items-center gap-2">
          <Button type="submit" size="sm">Apply</Button>
          <Button variant="quiet" size="sm" onClick={() => onChange(EMPTY_AUDIT_FILTERS, 1)}>Clear</Button>
        </div>
      </form>
      {filters.subjectId ? (
        <p className="text-small text-ink-soft">
          Only record <code className="numerals">{filters.subjectId}</code>.{' '}
          <button type="button" className="underline" onClick={() => onChange({ ...filters, subjectId: '' }, 1)}>Show all records</button>
        </p>
      ) : null}
      {events.isPending ? (
        <LoadingNote what="the audit log" />
      ) : events.isError ? (
        <ProblemNote title="The audit log could not be loaded" message={events.error.message} />
      ) : (
        <>
          <DataTable caption="Audit log" captionHidden columns={COLUMNS} rows={events.data.items} rowKey={(event) => String(event.id)} emptyText="No event matches these filters." />
          <Pager what="events" page={page} pageSize={PAGE_SIZE} total={events.data.total} onPage={(next) => onChange(filters, next)} />
        </>
      )}
    </div>
  );
}
