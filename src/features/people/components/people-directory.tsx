import { useState } from 'react';
import { FILTER_CONTROL_CLASS, FilterField } from '@/components/ui/filter-field';
import { Button } from '@/components/ui/button';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { LoadingNote } from '@/components/ui/loading-note';
import { Pager } from '@/components/ui/pager';
import { ProblemNote } from '@/components/ui/problem-note';
import { ROLE_LABELS } from '@/lib/authorization';
import { formatDateTime } from '@/lib/format-date-time';
import { personRoles, type AdminPersonSummary } from '@shared/schemas/admin';
import { useChangePersonRoles } from '@/features/people/api/change-person-roles';
import { usePeople, type PeopleFilters } from '@/features/people/api/get-people';
import { useSendPasswordReset } from '@/features/people/api/send-password-reset';
import { useSetPersonActive } from '@/features/people/api/set-person-active';
import { RoleChips } from '@/features/people/components/role-chips';

const PAGE_SIZE = 25;

type Notice = { tone: 'done' | 'problem'; text: string } | null;

function PersonActions({ person, onNotice }: { person: AdminPersonSummary; onNotice: (notice: Notice) => void }) {
  const [confirming, setConfirming] = useState(false);
  const setActive = useSetPersonActive();
  const reset = useSendPasswordReset();

  if (!person.active) {
    return (
      <Button
        variant="secondary"
        size="sm"
        isBusy={setActive.isPending}
        onClick={() =>
          setActive.mutate(
            { personId: person.id, active: true },
            {
              onSuccess: () => onNotice({ tone: 'done', text: `${person.name} can sign in again.` }),
              onError: (error) => onNotice({ tone: 'problem', text: error.message }),
            },
          )
        }
      >
        Reactivate
      </Button>
    );
  }
  if (confirming) {
    return (
      <span className="flex items-center gap-1.5" role="group" aria-label={`Confirm deactivating ${person.name}`}>
        <span className="text-caption text-ink-soft">Sign out and block?</span>
        <Button
          size="sm"
          isBusy={setActive.isPending}
          onClick={() =>
            setActive.mutate(
              { personId: person.id, active: false },
              {
                onSuccess: () => onNotice({ tone: 'done', text: `${person.name} is deactivated; their sessions have ended.` }),
                onError: (error) => onNotice({ tone: 'problem', text: error.message }),
                onSettled: () => setConfirming(false),
              },
            )
          }
        >
          Deactivate
        </Button>
        <Button variant="quiet" size="sm" onClick={() => setConfirming(false)}>
          Keep
        </Button>
      </span>
    );
  }
  return (
    <span className="flex items-center gap-1 whitespace-nowrap">
      <Button
        variant="quiet"
        size="sm"
        isBusy={reset.isPending}
        onClick={() =>
          reset.mutate(person.id, {
            onSuccess: () => onNotice({ tone: 'done', text: `A password link for ${person.name} is in the outbox.` }),
            onError: (error) => onNotice({ tone: 'problem', text: error.message }),
          })
        }
      >
        Password link
      </Button>
      <Button variant="secondary" size="sm" onClick={() => setConfirming(true)}>
        Deactivate…
      </Button>
    </span>
  );
}

/** Everyone with a sign-in, searched and filtered on the server; roles switch in place. */
export function PeopleDirectory() {
  const [filters, setFilters] = useState<PeopleFilters>({ q: '', role: '', active: '', page: 1, pageSize: PAGE_SIZE });
  const [notice, setNotice] = useState<Notice>(null);
  const people = usePeople(filters);
  const changeRoles = useChangePersonRoles();

  const update = (patch: Partial<PeopleFilters>) => setFilters((current) => ({ ...current, page: 1, ...patch }));

  const columns: DataTableColumn<AdminPersonSummary>[] = [
    {
      key: 'name',
      header: 'Name',
      cell: (person) => (
        <span className="flex flex-col">
          <span className="font-medium text-ink">{person.name}</span>
          <span className="numerals whitespace-nowrap text-caption text-ink-faint">{person.email}</span>
        </span>
      ),
    },
    {
      key: 'roles',
      header: 'Roles',
      widthClass: 'w-64',
      cell: (person) => (
        <RoleChips
          person={person}
          disabled={changeRoles.isPending || !person.active}
          onChange={(roles) =>
            changeRoles.mutate(
              { personId: person.id, roles },
              {
                onSuccess: () => setNotice({ tone: 'done', text: `Roles of ${person.name}: ${roles.map((r) => ROLE_LABELS[r]).join(', ')}.` }),
                onError: (error) => setNotice({ tone: 'problem', text: error.message }),
              },
            )
          }
        />
      ),
    },
    {
      key: 'organisation',
      header: 'Organisation',
      cell: (person) => person.organisation?.name ?? <span className="text-ink-faint">—</span>,
    },
    {
      key: 'lastSignIn',
      header: 'Last sign-in',
      widthClass: 'w-36',
      cell: (person) => <span className="numerals whitespace-nowrap text-caption">{person.lastSignInAt ? formatDateTime(person.lastSignInAt) : 'never'}</span>,
    },
    {
      key: 'status',
      header: 'Status',
      widthClass: 'w-24',
      cell: (person) => (person.active ? 'Active' : <span className="italic">Deactivated</span>),
    },
    { key: 'actions', header: <span className="sr-only">Actions</span>, widthClass: 'w-64', cell: (person) => <PersonActions person={person} onNotice={setNotice} /> },
  ];

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <FilterField label="Find">
          {(id) => (
            <input
              id={id}
              type="search"
              value={filters.q}
              onChange={(event) => update({ q: event.target.value })}
              placeholder="name or e-mail"
              className={`${FILTER_CONTROL_CLASS} w-64`}
            />
          )}
        </FilterField>
        <FilterField label="Role">
          {(id) => (
            <select id={id} value={filters.role} onChange={(event) => update({ role: event.target.value as PeopleFilters['role'] })} className={FILTER_CONTROL_CLASS}>
              <option value="">Any role</option>
              {personRoles.map((role) => (
                <option key={role} value={role}>
                  {ROLE_LABELS[role]}
                </option>
              ))}
            </select>
          )}
        </FilterField>
        <FilterField label="Status">
          {(id) => (
            <select id={id} value={filters.active} onChange={(event) => update({ active: event.target.value as PeopleFilters['active'] })} className={FILTER_CONTROL_CLASS}>
              <option value="">Active and deactivated</option>
              <option value="true">Active only</option>
              <option value="false">Deactivated only</option>
            </select>
          )}
        </FilterField>
      </div>

      <div role="status" aria-live="polite" className="text-small">
        {notice ? <p className={notice.tone === 'problem' ? 'font-medium text-nonconform' : 'text-ink-soft'}>{notice.text}</p> : null}
      </div>

      {people.isPending ? (
        <LoadingNote what="people" />
      ) : people.isError ? (
        <ProblemNote
          title="The people list could not be loaded"
          message={people.error.message}
          action={
            <Button variant="secondary" size="sm" onClick={() => people.refetch()} isBusy={people.isFetching}>
              Load again
            </Button>
          }
        />
      ) : (
        <>
          <DataTable
            caption="People with a Paraxia sign-in"
            captionHidden
            columns={columns}
            rows={people.data.people}
            rowKey={(person) => person.id}
            isRowMuted={(person) => !person.active}
            emptyText={filters.q || filters.role || filters.active ? 'Nobody matches these filters.' : 'Nobody has a sign-in yet.'}
          />
          <Pager what="people" page={filters.page} pageSize={filters.pageSize} total={people.data.total} onPage={(page) => setFilters((f) => ({ ...f, page }))} />
        </>
      )}
    </div>
  );
}
