import { useState } from 'react';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { InviteForm } from '@/features/people/components/invite-form';
import { InvitationsList } from '@/features/people/components/invitations-list';
import { PeopleDirectory } from '@/features/people/components/people-directory';

export function AdminPeopleRoute() {
  const [inviting, setInviting] = useState(false);
  const [sent, setSent] = useState<string | null>(null);
  return (
    <div className="space-y-8">
      <title>People · Paraxia</title>
      <PageHeader
        kicker="Administration"
        title="People"
        actions={
          <Button onClick={() => { setInviting((open) => !open); setSent(null); }} aria-expanded={inviting}>
            {inviting ? 'Close the invitation' : 'Invite a person'}
          </Button>
        }
      >
        Lab staff and client contacts who can sign in. Switch a role on or off in the table; deactivating someone ends
        their sessions at once. The last active administrator always keeps that role.
      </PageHeader>
      {inviting ? (
        <RegionErrorBoundary region="Invitation">
          <InviteForm onDone={(message) => { setSent(message); setInviting(false); }} />
        </RegionErrorBoundary>
      ) : null}
      {sent ? (
        <p role="status" className="rounded-sheet border border-conforms/40 bg-conforms-tint/60 px-3 py-2 text-small text-ink">
          {sent}
        </p>
      ) : null}
      <Section title="Everyone with a sign-in">
        <RegionErrorBoundary region="People">
          <PeopleDirectory />
        </RegionErrorBoundary>
      </Section>
      <Section title="Invitations" description="A link works once and expires; sending again replaces the old link.">
        <RegionErrorBoundary region="Invitations">
          <InvitationsList />
        </RegionErrorBoundary>
      </Section>
    </div>
  );
}
