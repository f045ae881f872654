import { Link } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { ROLE_LABELS } from '@/lib/authorization';
import { personRoles, type AdminPersonSummary, type PersonRole } from '@shared/schemas/admin';
import { usePeople } from '@/features/people/api/get-people';

interface RoleCount {
  role: PersonRole;
  active: number;
  neverSignedIn: number;
}

export function countPeopleByRole(people: readonly AdminPersonSummary[]): RoleCount[] {
  return personRoles.map((role) => {
    const holders = people.filter((person) => person.active && person.roles.includes(role));
    return { role, active: holders.length, neverSignedIn: holders.filter((person) => person.lastSignInAt === null).length };
  });
}

const COLUMNS: DataTableColumn<RoleCount>[] = [
  { key: 'role', header: 'Role', cell: (row) => ROLE_LABELS[row.role] },
  { key: 'active', header: 'Active', numeric: true, widthClass: 'w-24', cell: (row) => row.active },
  { key: 'never', header: 'Never signed in', numeric: true, widthClass: 'w-36', cell: (row) => row.neverSignedIn },
];

/** Who can sign in, counted by role, with the way to the people page. */
export function PeopleTable() {
  const people = usePeople({ q: '', role: '', active: '', page: 1, pageSize: 200 });
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
  const deactivated = people.data.people.filter((person) => !person.active).length;
  return (
    <div className="space-y-2">
      <DataTable caption="Active people by role" captionHidden columns={COLUMNS} rows={countPeopleByRole(people.data.people)} rowKey={(row) => row.role} />
      <p className="flex flex-wrap items-baseline justify-between gap-2 text-small text-ink-faint">
        <span>
          <span className="numerals text-ink">{people.data.total}</span> accounts, <span className="numerals text-ink">{deactivated}</span> deactivated
        </span>
        <Link to="/admin/people" className="font-medium text-ink underline decoration-rule-strong underline-offset-2 hover:decoration-ink">
          Manage people and invitations →
        </Link>
      </p>
    </div>
  );
}
