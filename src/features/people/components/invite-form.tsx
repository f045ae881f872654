import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { ROLE_LABELS } from '@/lib/authorization';
import { splitServerProblems } from '@/lib/server-problems';
import type { PersonRole } from '@shared/schemas/admin';
import { useCreateInvitation } from '@/features/people/api/create-invitation';
import { useOrganisationChoices } from '@/features/people/api/get-organisation-choices';

type Kind = 'staff' | 'client';

/** Invite lab staff (roles) or a client contact (their organisation); the link goes out by e-mail. */
export function InviteForm({ onDone }: { onDone: (message: string) => void }) {
  const [kind, setKind] = useState<Kind>('staff');
  const [name, setName] = useState('');
  const [email, setEmail] = useState('');
  const [roles, setRoles] = useState<PersonRole[]>(['technician']);
  const [organisationId, setOrganisationId] = useState('');
  const organisations = useOrganisationChoices();
  const clients = (organisations.data ?? []).filter((o) => o.kind === 'client');
  const create = useCreateInvitation({
    onCreated: (invitation) => onDone(`Invitation for ${invitation.name} <${invitation.email}> is in the outbox; the link works for 7 days.`),
  });
  const problems = splitServerProblems(create.error, ['name', 'email', 'roles', 'organisationId']);

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    create.mutate({
      name: name.trim(),
      email: email.trim(),
      roles: kind === 'client' ? ['client'] : roles,
      organisationId: kind === 'client' ? organisationId || null : null,
    });
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-4 rounded-sheet border border-rule bg-sheet p-4 shadow-sheet" aria-label="Invite a person">
      <fieldset className="flex flex-wrap gap-4 text-small">
        <legend className="mb-1 text-small font-medium text-ink">Who</legend>
        {(['staff', 'client'] as const).map((choice) => (
          <label key={choice} className="flex items-center gap-1.5">
            <input type="radio" name="invite-kind" value={choice} checked={kind === choice} onChange={() => setKind(choice)} />
            {choice === 'staff' ? 'Lab staff' : 'A client’s contact'}
          </label>
        ))}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" name="name" value={name} onChange={(event) => setName(event.target.value)} error={problems.byField.name} autoComplete="off" />
        <TextField
          label="E-mail address"
          name="email"
          type="email"
          value={email}
          onChange={(event) => setEmail(event.target.value)}
          error={problems.byField.email}
          autoComplete="off"
          spellCheck={false}
        />
      </div>
      {kind === 'staff' ? (
        <fieldset className="space-y-1">
          <legend className="text-small font-medium text-ink">Roles</legend>
          <div className="flex flex-wrap gap-4 text-small">
            {(['technician', 'reviewer', 'admin'] as const).map((role) => (
              <label key={role} className="flex items-center gap-1.5">
                <input
                  type="checkbox"
                  name="roles"
                  value={role}
                  checked={roles.includes(role)}
                  onChange={(event) => setRoles((current) => (event.target.checked ? [...current, role] : current.filter((r) => r !== role)))}
                />
                {ROLE_LABELS[role]}
              </label>
            ))}
          </div>
          {problems.byField.roles ? <p className="text-small text-nonconform">{problems.byField.roles}</p> : null}
        </fieldset>
      ) : (
        <div className="flex flex-col gap-1.5">
          <label htmlFor="invite-organisation" className="text-small font-medium text-ink">
            Client organisation
          </label>
          <select
            id="invite-organisation"
            value={organisationId}
            onChange={(event) => setOrganisationId(event.target.value)}
            className="h-10 rounded-sheet border border-rule-strong bg-sheet px-3 text-body"
          >
            <option value="">Choose…</option>
            {clients.map((organisation) => (
              <option key={organisation.id} value={organisation.id}>
                {organisation.name}
              </option>
            ))}
          </select>
          {problems.byField.organisationId || problems.byField.roles ? (
            <p className="text-small text-nonconform">{problems.byField.organisationId ?? problems.byField.roles}</p>
          ) : null}
        </div>
      )}
      {problems.leftOver ? (
        <p role="alert" className="text-small font-medium text-nonconform">
          {problems.leftOver}
        </p>
      ) : null}
      <div className="flex items-center gap-3">
        <Button type="submit" isBusy={create.isPending}>
          Send invitation
        </Button>
        <p className="text-caption text-ink-faint">They choose their own password from the link; nobody else ever sees it.</p>
      </div>
    </form>
  );
}
