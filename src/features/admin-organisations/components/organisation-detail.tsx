import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { TextField } from '@/components/ui/text-field';
import { TextAreaField } from '@/components/ui/text-area-field';
import { splitServerProblems } from '@/lib/server-problems';
import { POSTAL_ADDRESS_MAX_LINES, type OrganisationContact, type OrganisationDetail as Detail } from '@shared/schemas/admin';
import { useDeleteContact } from '@/features/admin-organisations/api/delete-contact';
import { useOrganisation } from '@/features/admin-organisations/api/get-organisation';
import { useSaveOrganisation } from '@/features/admin-organisations/api/save-organisation';
import { ContactForm } from '@/features/admin-organisations/components/contact-form';

function DetailsForm({ organisation, onClose }: { organisation: Detail; onClose: () => void }) {
  const [name, setName] = useState(organisation.name);
  const [postalAddress, setPostalAddress] = useState(organisation.postalAddress);
  const [email, setEmail] = useState(organisation.email ?? '');
  const [phone, setPhone] = useState(organisation.phone ?? '');
  const save = useSaveOrganisation({ onSaved: onClose });
  const problems = splitServerProblems(save.error, ['name', 'postalAddress', 'email', 'phone']);
  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    save.mutate({ organisationId: organisation.id, name: name.trim(), postalAddress, email: email.trim() || null, phone: phone.trim() || null });
  }
  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Change the organisation’s details">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Name" value={name} onChange={(event) => setName(event.target.value)} error={problems.byField.name} />
        <TextAreaField
          label="Postal address"
          hint={
            organisation.kind === 'lab'
              ? `One line per line, up to ${POSTAL_ADDRESS_MAX_LINES}; printed at the top of every certificate, which cannot be issued without it.`
              : `One line per line, up to ${POSTAL_ADDRESS_MAX_LINES}; printed in the client block of its certificates.`
          }
          rows={4}
          value={postalAddress}
          onChange={(event) => setPostalAddress(event.target.value)}
          error={problems.byField.postalAddress}
          className="sm:row-span-2"
        />
        <TextField label="E-mail address" hint="Optional" type="email" value={email} onChange={(event) => setEmail(event.target.value)} error={problems.byField.email} spellCheck={false} />
        <TextField label="Phone" hint="Optional" value={phone} onChange={(event) => setPhone(event.target.value)} error={problems.byField.phone} />
      </div>
      {problems.leftOver ? <p role="alert" className="text-small font-medium text-nonconform">{problems.leftOver}</p> : null}
      <div className="flex gap-2">
        <Button type="submit" size="sm" isBusy={save.isPending}>
          Save details
        </Button>
        <Button variant="quiet" size="sm" onClick={onClose}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** The address, e-mail and phone as recorded, or a sentence saying what is missing. */
function RecordedDetails({ organisation }: { organisation: Detail }) {
  const lines = organisation.postalAddress ? organisation.postalAddress.split('\n') : [];
  const reach = [organisation.email, organisation.phone].filter(Boolean).join(' · ');
  return (
    <div className="text-small text-ink-soft">
      {lines.length > 0 ? (
        <address className="not-italic">
          {lines.map((line, index) => (
            <span key={index} className="block">
              {line}
            </span>
          ))}
        </address>
      ) : organisation.kind === 'lab' ? (
        <p role="note" className="font-medium text-nonconform">
          No postal address recorded: certificates cannot be issued until it is entered.
        </p>
      ) : (
        <p className="text-ink-faint">No postal address recorded.</p>
      )}
      {reach ? <p className="numerals mt-1 text-caption">{reach}</p> : null}
    </div>
  );
}

function ContactRowActions({ organisationId, contact, onEdit }: { organisationId: string; contact: OrganisationContact; onEdit: () => void }) {
  const remove = useDeleteContact();
  const [confirming, setConfirming] = useState(false);
  if (confirming) {
    return (
      <span className="flex items-center gap-1">
        <Button size="sm" isBusy={remove.isPending} onClick={() => remove.mutate({ organisationId, contactId: contact.id })}>
          Remove
        </Button>
        <Button variant="quiet" size="sm" onClick={() => setConfirming(false)}>
          Keep
        </Button>
      </span>
    );
  }
  return (
    <span className="flex items-center gap-1">
      <Button variant="secondary" size="sm" onClick={onEdit}>
        Change
      </Button>
      <Button variant="quiet" size="sm" onClick={() => setConfirming(true)}>
        Remove…
      </Button>
    </span>
  );
}

/** One organisation: its name, contacts (editable) and the people who sign in for it. */
export function OrganisationDetailPanel({ organisationId }: { organisationId: string }) {
  const organisation = useOrganisation(organisationId);
  const [changingDetails, setChangingDetails] = useState(false);
  const [editing, setEditing] = useState<string | 'new' | null>(null);

  if (organisation.isPending) return <LoadingNote what="the organisation" />;
  if (organisation.isError) return <ProblemNote title="The organisation could not be loaded" message={organisation.error.message} />;
  const detail = organisation.data;

  const columns: DataTableColumn<OrganisationContact>[] = [
    {
      key: 'name',
      header: 'Contact',
      cell: (contact) => (
        <span className="flex flex-col">
          <span className="whitespace-nowrap font-medium text-ink">{contact.name}</span>
          <span className="text-caption text-ink-faint">{contact.position ?? 'No position given'}</span>
        </span>
      ),
    },
    {
      key: 'reach',
      header: 'E-mail and phone',
      cell: (contact) => (
        <span className="flex flex-col">
          <span className="numerals whitespace-nowrap text-caption">{contact.email}</span>
          <span className="numerals text-caption text-ink-faint">{contact.phone ?? '—'}</span>
        </span>
      ),
    },
    { key: 'certificates', header: 'Certificates', widthClass: 'w-28', cell: (contact) => (contact.receivesCertificates ? 'Sent to them' : <span className="text-ink-faint">Not sent</span>) },
    {
      key: 'actions',
      header: <span className="sr-only">Actions</span>,
      widthClass: 'w-44',
      cell: (contact) => <ContactRowActions organisationId={detail.id} contact={contact} onEdit={() => setEditing(contact.id)} />,
    },
  ];
  const editedContact = editing && editing !== 'new' ? detail.contacts.find((contact) => contact.id === editing) : undefined;

  return (
    <article aria-label={detail.name} className="space-y-5 rounded-sheet border border-rule bg-sheet p-5 shadow-sheet">
      {changingDetails ? (
        <DetailsForm organisation={detail} onClose={() => setChangingDetails(false)} />
      ) : (
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div className="space-y-2">
            <div>
              <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">{detail.kind === 'lab' ? 'The lab' : 'Client'}</p>
              <h2 className="text-title">{detail.name}</h2>
              <p className="mt-1 text-small text-ink-soft">
                <span className="numerals">{detail.workOrderCount}</span> work orders · <span className="numerals">{detail.personCount}</span> people with a sign-in
              </p>
            </div>
            <RecordedDetails organisation={detail} />
          </div>
          <Button variant="secondary" size="sm" onClick={() => setChangingDetails(true)}>
            Change details
          </Button>
        </div>
      )}

      <section className="space-y-2" aria-label="Contacts">
        <div className="flex items-baseline justify-between gap-2">
          <h3 className="text-title-sm">Contacts</h3>
          {editing === null ? (
            <Button size="sm" variant="secondary" onClick={() => setEditing('new')}>
              Add a contact
            </Button>
          ) : null}
        </div>
        {editing === 'new' ? <ContactForm organisationId={detail.id} onClose={() => setEditing(null)} /> : null}
        {editedContact ? <ContactForm key={editedContact.id} organisationId={detail.id} contact={editedContact} onClose={() => setEditing(null)} /> : null}
        <DataTable
          caption={`Contacts at ${detail.name}`}
          captionHidden
          columns={columns}
          rows={detail.contacts}
          rowKey={(contact) => contact.id}
          emptyText="No contacts yet. Add the people who should hear about certificates and returned work."
        />
      </section>

      <section className="space-y-2" aria-label="People who sign in">
        <h3 className="text-title-sm">People who sign in</h3>
        {detail.people.length === 0 ? (
          <p className="text-small text-ink-faint">Nobody signs in for this organisation yet; invite a contact from the People page.</p>
        ) : (
          <ul className="divide-y divide-rule/70 rounded-sheet border border-rule text-small">
            {detail.people.map((person) => (
              <li key={person.id} className={`flex justify-between gap-3 px-3 py-1.5 ${person.active ? '' : 'text-ink-faint'}`}>
                <span>{person.name}</span>
                <span className="numerals text-caption">
                  {person.email}
                  {person.active ? '' : ' · deactivated'}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </article>
  );
}
