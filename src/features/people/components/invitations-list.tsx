import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { describeRoles } from '@/lib/authorization';
import { formatDateTime } from '@/lib/format-date-time';
import { type InvitationState, type InvitationSummary } from '@shared/schemas/admin';
import { useChangeInvitation } from '@/features/people/api/change-invitation';
import { useInvitations } from '@/features/people/api/get-invitations';

const STATE_WORDS: Record<InvitationState, string> = { pending: 'Waiting', used: 'Accepted', expired: 'Expired', revoked: 'Withdrawn' };

function InvitationActions({ invitation }: { invitation: InvitationSummary }) {
  const change = useChangeInvitation();
  if (invitation.state === 'used') return <span className="text-caption text-ink-faint">{formatDateTime(invitation.usedAt)}</span>;
  return (
    <span className="flex items-center gap-1">
      <Button variant="secondary" size="sm" isBusy={change.isPending && change.variables?.change === 'resend'} onClick={() => change.mutate({ invitationId: invitation.id, change: 'resend' })}>
        Send again
      </Button>
      {invitation.state === 'pending' ? (
        <Button variant="quiet" size="sm" isBusy={change.isPending && change.variables?.change === 'revoke'} onClick={() => change.mutate({ invitationId: invitation.id, change: 'revoke' })}>
          Withdraw
        </Button>
      ) : null}
      {change.isError ? <span className="text-caption text-nonconform">{change.error.message}</span> : null}
    </span>
  );
}

const COLUMNS: DataTableColumn<InvitationSummary>[] = [
  {
    key: 'who',
    header: 'Invited',
    cell: (invitation) => (
      <span className="flex flex-col">
        <span className="font-medium text-ink">{invitation.name}</span>
        <span className="numerals whitespace-nowrap text-caption text-ink-faint">{invitation.email}</span>
      </span>
    ),
  },
  { key: 'roles', header: 'As', cell: (invitation) => `${describeRoles(invitation.roles)}${invitation.organisation && invitation.roles.includes('client') ? ` · ${invitation.organisation.name}` : ''}` },
  { key: 'by', header: 'By', cell: (invitation) => invitation.invitedBy?.name ?? <span className="text-ink-faint">—</span> },
  { key: 'state', header: 'State', widthClass: 'w-24', cell: (invitation) => STATE_WORDS[invitation.state] },
  { key: 'expires', header: 'Link expires', widthClass: 'w-36', cell: (invitation) => <span className="numerals text-caption">{formatDateTime(invitation.expiresAt)}</span> },
  { key: 'actions', header: <span className="sr-only">Actions</span>, widthClass: 'w-52', cell: (invitation) => <InvitationActions invitation={invitation} /> },
];

export function InvitationsList() {
  const [state, setState] = useState<InvitationState | ''>('pending');
  const invitations = useInvitations(state);
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-1" role="group" aria-label="Show invitations">
        {(['pending', 'used', 'expired', 'revoked', ''] as const).map((choice) => (
          <Button key={choice || 'all'} variant={state === choice ? 'primary' : 'secondary'} size="sm" aria-pressed={state === choice} onClick={() => setState(choice)}>
            {choice ? STATE_WORDS[choice] : 'All'}
          </Button>
        ))}
      </div>
      {invitations.isPending ? (
        <LoadingNote what="invitations" />
      ) : invitations.isError ? (
        <ProblemNote title="The invitations could not be loaded" message={invitations.error.message} />
      ) : (
        <DataTable
          caption="Invitations"
          captionHidden
          columns={COLUMNS}
          rows={invitations.data}
          rowKey={(invitation) => invitation.id}
          isRowMuted={(invitation) => invitation.state === 'expired' || invitation.state === 'revoked'}
          emptyText={state === 'pending' ? 'No invitation is waiting to be accepted.' : `No ${state ? STATE_WORDS[state].toLowerCase() : ''} invitations.`.replace('  ', ' ')}
        />
      )}
    </div>
  );
}

