import { useId, useMemo, useState } from 'react';
import { Button } from '@/components/ui/button';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { ROLE_LABELS, rolesInWorkOrder } from '@/lib/authorization';
import type { Person } from '@/types/api';
import { usePeople } from '@/features/people/api/get-people';

const COLUMNS: DataTableColumn<Person>[] = [
  { key: 'name', header: 'Name', cell: (person) => <span className="font-medium">{person.name}</span> },
  { key: 'email', header: 'E-mail', cell: (person) => <span className="numerals text-caption">{person.email}</span> },
  {
    key: 'roles',
    header: 'Roles',
    cell: (person) => (
      <span className="flex flex-wrap gap-1">
        {rolesInWorkOrder(person.roles).map((role) => (
          <span key={role} className="rounded-hair border border-rule bg-paper px-1.5 text-caption text-ink-soft">
            {ROLE_LABELS[role]}
          </span>
        ))}
      </span>
    ),
  },
  {
    key: 'organisation',
    header: 'Organisation',
    cell: (person) =>
      person.organisation ? (
        <span>
          {person.organisation.name}{' '}
          <span className="text-caption text-ink-faint">({person.organisation.kind === 'lab' ? 'lab' : 'client'})</span>
        </span>
      ) : (
        <span className="text-ink-faint">—</span>
      ),
  },
  {
    key: 'status',
    header: 'Status',
    widthClass: 'w-24',
    cell: (person) => (person.active ? 'Active' : <span className="italic">Inactive</span>),
  },
];

export function filterPeople(people: readonly Person[], query: string): Person[] {
  const needle = query.trim().toLowerCase();
  if (needle === '') return [...people];
  return people.filter((person) =>
    [person.name, person.email, person.organisation?.name ?? '', ...person.roles.map((role) => ROLE_LABELS[role as keyof typeof ROLE_LABELS] ?? role)]
      .join(' ')
      .toLowerCase()
      .includes(needle),
  );
}

/** Everyone with a sign-in, for administrators; dense so a lab's whole staff fits on a screen. */
export function PeopleTable() {
  const people = usePeople();
  const [query, setQuery] = useState('');
  const searchId = useId();
  const shown = useMemo(() => filterPeople(people.data ?? [], query), [people.data, query]);

  if (people.isPending) return <LoadingNote what="people" />;
  if (people.isError) {
    return (
      <ProblemNote
        title="The people list could not be loaded"
        message={people.error.message}
        action={
          <Button variant="secondary" size="sm" onClick={() => people.refetch()} isBusy={people.isFetching}>
            Load again
          </Button>
        }
      />
    );
  }

  const activeCount = people.data.filter((person) => person.active).length;
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <p className="text-small text-ink-faint">
          <span className="numerals text-ink">{people.data.length}</span> people,{' '}
          <span className="numerals text-ink">{activeCount}</span> active
        </p>
        <div className="flex items-center gap-2">
          <label htmlFor={searchId} className="text-small text-ink-soft">
            Find
          </label>
          <input
            id={searchId}
            type="search"
            value={query}
            onChange={(event) => setQuery(event.target.value)}
            placeholder="name, e-mail, role…"
            className="h-8 w-56 rounded-sheet border border-rule-strong bg-sheet px-2 text-small"
          />
        </div>
      </div>
      <DataTable
        caption="People with a Paraxia sign-in"
        captionHidden
        columns={COLUMNS}
        rows={shown}
        rowKey={(person) => person.id}
        isRowMuted={(person) => !person.active}
        emptyText={query ? `Nobody matches “${query}”.` : 'Nobody has a sign-in yet.'}
      />
    </div>
  );
}
