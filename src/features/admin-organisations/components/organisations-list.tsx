import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { TextField } from '@/components/ui/text-field';
import { splitServerProblems } from '@/lib/server-problems';
import { useOrganisationsWithCounts } from '@/features/admin-organisations/api/get-organisations';
import { useSaveOrganisation } from '@/features/admin-organisations/api/save-organisation';

function NewOrganisationForm({ onCreated }: { onCreated: (id: string) => void }) {
  const [name, setName] = useState('');
  const save = useSaveOrganisation({ onSaved: (organisation) => { setName(''); onCreated(organisation.id); } });
  const problems = splitServerProblems(save.error, ['name']);
  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    save.mutate({ organisationId: null, name: name.trim() });
  }
  return (
    <form onSubmit={submit} noValidate className="flex items-end gap-2" aria-label="New client organisation">
      <TextField label="New client organisation" value={name} onChange={(event) => setName(event.target.value)} error={problems.byField.name ?? problems.leftOver ?? undefined} className="flex-1" />
      <Button type="submit" variant="secondary" isBusy={save.isPending}>
        Add
      </Button>
    </form>
  );
}

export interface OrganisationsListProps {
  selectedId: string | null;
  onSelect: (id: string) => void;
}

/** The lab and its clients with their counts; choosing one opens it beside the list. */
export function OrganisationsList({ selectedId, onSelect }: OrganisationsListProps) {
  const organisations = useOrganisationsWithCounts();
  if (organisations.isPending) return <LoadingNote what="organisations" />;
  if (organisations.isError) return <ProblemNote title="The organisations could not be loaded" message={organisations.error.message} />;
  const sorted = [...organisations.data].sort((a, b) => (a.kind === b.kind ? a.name.localeCompare(b.name) : a.kind === 'lab' ? -1 : 1));
  return (
    <div className="space-y-4">
      <ul className="divide-y divide-rule/70 overflow-hidden rounded-sheet border border-rule bg-sheet" aria-label="Organisations">
        {sorted.map((organisation) => {
          const selected = organisation.id === selectedId;
          return (
            <li key={organisation.id}>
              <button
                type="button"
                aria-current={selected ? 'true' : undefined}
                onClick={() => onSelect(organisation.id)}
                className={`flex w-full items-baseline justify-between gap-3 px-3 py-2 text-left hover:bg-shade/70 ${selected ? 'bg-shade' : ''}`}
              >
                <span className="flex flex-col">
                  <span className={`font-medium ${selected ? 'text-ink underline decoration-ink underline-offset-4' : 'text-ink'}`}>{organisation.name}</span>
                  <span className="text-caption text-ink-faint">{organisation.kind === 'lab' ? 'The lab' : 'Client'}</span>
                </span>
                <span className="numerals shrink-0 text-right text-caption text-ink-soft">
                  {organisation.contactCount} {organisation.contactCount === 1 ? 'contact' : 'contacts'}
                  <br />
                  {organisation.workOrderCount} {organisation.workOrderCount === 1 ? 'work order' : 'work orders'}
                </span>
              </button>
            </li>
          );
        })}
      </ul>
      <NewOrganisationForm onCreated={onSelect} />
    </div>
  );
}
