import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { splitServerProblems } from '@/lib/server-problems';
import type { OrganisationContact } from '@shared/schemas/admin';
import { useSaveContact } from '@/features/admin-organisations/api/save-contact';

export interface ContactFormProps {
  organisationId: string;
  /** The contact being changed; absent for a new one. */
  contact?: OrganisationContact;
  onClose: () => void;
}

export function ContactForm({ organisationId, contact, onClose }: ContactFormProps) {
  const [name, setName] = useState(contact?.name ?? '');
  const [email, setEmail] = useState(contact?.email ?? '');
  const [position, setPosition] = useState(contact?.position ?? '');
  const [phone, setPhone] = useState(contact?.phone ?? '');
  const [receivesCertificates, setReceivesCertificates] = useState(contact?.receivesCertificates ?? true);
  const save = useSaveContact({ onSaved: onClose });
  const problems = splitServerProblems(save.error, ['name', 'email', 'position', 'phone']);

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    save.mutate({
      organisationId,
      contactId: contact?.id ?? null,
      contact: { name: name.trim(), email: email.trim(), position: position.trim() || null, phone: phone.trim() || null, receivesCertificates },
    });
  }

  return (
    <form onSubmit={submit} noValidate aria-label={contact ? `Change ${contact.name}` : 'Add a contact'} className="space-y-3 rounded-sheet border border-rule bg-paper/60 p-3">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Name" value={name} onChange={(event) => setName(event.target.value)} error={problems.byField.name} />
        <TextField label="E-mail address" type="email" value={email} onChange={(event) => setEmail(event.target.value)} error={problems.byField.email} spellCheck={false} />
        <TextField label="Position" hint="Optional, e.g. Quality manager" value={position} onChange={(event) => setPosition(event.target.value)} error={problems.byField.position} />
        <TextField label="Phone" hint="Optional" value={phone} onChange={(event) => setPhone(event.target.value)} error={problems.byField.phone} />
      </div>
      <label className="flex items-center gap-2 text-small">
        <input type="checkbox" checked={receivesCertificates} onChange={(event) => setReceivesCertificates(event.target.checked)} />
        Receives the e-mail when a certificate is issued
      </label>
      {problems.leftOver ? <p role="alert" className="text-small font-medium text-nonconform">{problems.leftOver}</p> : null}
      <div className="flex gap-2">
        <Button type="submit" size="sm" isBusy={save.isPending}>
          {contact ? 'Save contact' : 'Add contact'}
        </Button>
        <Button variant="quiet" size="sm" onClick={onClose}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
