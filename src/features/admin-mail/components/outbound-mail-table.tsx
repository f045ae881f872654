import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { LoadingNote } from '@/components/ui/loading-note';
import { Pager } from '@/components/ui/pager';
import { ProblemNote } from '@/components/ui/problem-note';
import { formatDateTime } from '@/lib/format-date-time';
import { outboundMailStatuses, type OutboundMailRow, type OutboundMailStatus } from '@shared/schemas/admin';
import { useOutboundMail } from '@/features/admin-mail/api/get-outbound-mail';
import { useOutboundMessage } from '@/features/admin-mail/api/get-outbound-message';
import { useRetryOutboundMail } from '@/features/admin-mail/api/retry-outbound-mail';

const PAGE_SIZE = 25;

export const MAIL_STATUS_WORDS: Record<OutboundMailStatus, string> = {
  queued: 'Waiting',
  sending: 'Sending',
  sent: 'Sent',
  retrying: 'Will retry',
  failed: 'Failed',
};

const KIND_WORDS: Record<string, string> = {
  'certificate-issued': 'Certificate issued',
  'measurement-returned': 'Measurement returned',
  'work-requested': 'Work requested',
  invitation: 'Invitation',
  'password-reset': 'Password link',
};

function StatusWord({ status }: { status: OutboundMailStatus }) {
  const tone = status === 'failed' ? 'text-nonconform font-medium' : status === 'retrying' ? 'text-undecided font-medium' : status === 'sent' ? 'text-ink' : 'text-ink-soft';
  return <span className={tone}>{MAIL_STATUS_WORDS[status]}</span>;
}

function MessagePreview({ mailId, onClose }: { mailId: string; onClose: () => void }) {
  const message = useOutboundMessage(mailId);
  const retry = useRetryOutboundMail();
  if (message.isPending) return <LoadingNote what="the message" />;
  if (message.isError) return <ProblemNote title="The message could not be loaded" message={message.error.message} />;
  const m = message.data;
  const canRetry = m.status === 'failed' || m.status === 'retrying';
  return (
    <article aria-label="Message" className="space-y-3 rounded-sheet border border-rule bg-sheet p-4 shadow-sheet">
      <div className="flex items-start justify-between gap-3">
        <div>
          <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">{KIND_WORDS[m.kind] ?? m.kind}</p>
          <h3 className="text-title-sm">{m.subject}</h3>
        </div>
        <Button variant="quiet" size="sm" onClick={onClose}>
          Close
        </Button>
      </div>
      <dl className="grid grid-cols-[7rem_1fr] gap-x-3 gap-y-1 text-small">
        <dt className="text-ink-faint">To</dt>
        <dd className="numerals">{m.to.join(', ')}</dd>
        <dt className="text-ink-faint">Status</dt>
        <dd>
          <StatusWord status={m.status} /> · <span className="numerals">{m.attempts}</span> attempt{m.attempts === 1 ? '' : 's'}
        </dd>
        <dt className="text-ink-faint">Queued</dt>
        <dd className="numerals">{formatDateTime(m.createdAt)}</dd>
        <dt className="text-ink-faint">Sent</dt>
        <dd className="numerals">{formatDateTime(m.sentAt)}</dd>
        {m.lastError ? (
          <>
            <dt className="text-ink-faint">Last error</dt>
            <dd className="text-nonconform">{m.lastError}</dd>
          </>
        ) : null}
      </dl>
      {canRetry ? (
        <div className="flex items-center gap-2">
          <Button size="sm" isBusy={retry.isPending} onClick={() => retry.mutate(m.id)}>
            Try again now
          </Button>
          {retry.isError ? <span className="text-small text-nonconform">{retry.error.message}</span> : null}
        </div>
      ) : null}
      <pre className="max-h-96 overflow-auto whitespace-pre-wrap rounded-sheet border border-rule bg-paper px-3 py-2 font-mono text-caption text-ink">{m.textBody}</pre>
    </article>
  );
}

/** The outbox: every message the system sent or will send, its state and retries. */
export function OutboundMailTable() {
  const [status, setStatus] = useState<OutboundMailStatus | ''>('');
  const [page, setPage] = useState(1);
  const [openId, setOpenId] = useState<string | null>(null);
  const mail = useOutboundMail(status, page, PAGE_SIZE);
  const retry = useRetryOutboundMail();

  const columns: DataTableColumn<OutboundMailRow>[] = [
    { key: 'created', header: 'Queued', widthClass: 'w-36', cell: (m) => <span className="numerals text-caption">{formatDateTime(m.createdAt)}</span> },
    { key: 'kind', header: 'Kind', widthClass: 'w-40', cell: (m) => KIND_WORDS[m.kind] ?? m.kind },
    {
      key: 'subject',
      header: 'Subject and recipients',
      cell: (m) => (
        <button type="button" onClick={() => setOpenId(m.id)} className="flex flex-col text-left hover:underline" aria-label={`Show “${m.subject}”`}>
          <span className="text-ink">{m.subject}</span>
          <span className="numerals whitespace-nowrap text-caption text-ink-faint">{m.to.join(', ')}</span>
        </button>
      ),
    },
    { key: 'status', header: 'Status', widthClass: 'w-24', cell: (m) => <StatusWord status={m.status} /> },
    { key: 'attempts', header: 'Tries', numeric: true, widthClass: 'w-16', cell: (m) => m.attempts },
    {
      key: 'error',
      header: 'Last error',
      widthClass: 'w-56',
      cell: (m) => (m.lastError ? <span className="text-caption text-nonconform [overflow-wrap:anywhere]">{m.lastError}</span> : <span className="text-ink-faint">—</span>),
    },
    {
      key: 'actions',
      header: <span className="sr-only">Actions</span>,
      widthClass: 'w-28',
      cell: (m) =>
        m.status === 'failed' || m.status === 'retrying' ? (
          <Button variant="secondary" size="sm" isBusy={retry.isPending && retry.variables === m.id} onClick={() => retry.mutate(m.id)}>
            Retry now
          </Button>
        ) : null,
    },
  ];

  if (mail.isPending) return <LoadingNote what="the outbox" />;
  if (mail.isError) return <ProblemNote title="The outbox could not be loaded" message={mail.error.message} />;
  const counts = mail.data.countsByStatus;
  const all = Object.values(counts).reduce((sum, n) => sum + n, 0);

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap gap-1" role="group" aria-label="Show messages by status">
        <Button variant={status === '' ? 'primary' : 'secondary'} size="sm" aria-pressed={status === ''} onClick={() => { setStatus(''); setPage(1); }}>
          All <span className="numerals">{all}</span>
        </Button>
        {outboundMailStatuses.map((choice) => (
          <Button key={choice} variant={status === choice ? 'primary' : 'secondary'} size="sm" aria-pressed={status === choice} onClick={() => { setStatus(choice); setPage(1); }}>
            {MAIL_STATUS_WORDS[choice]} <span className="numerals">{counts[choice]}</span>
          </Button>
        ))}
      </div>
      {retry.isError ? <p role="alert" className="text-small font-medium text-nonconform">{retry.error.message}</p> : null}
      {openId ? <MessagePreview key={openId} mailId={openId} onClose={() => setOpenId(null)} /> : null}
      <DataTable
        caption="Outbound mail"
        captionHidden
        columns={columns}
        rows={mail.data.items}
        rowKey={(m) => m.id}
        emptyText={status ? `No message is ${MAIL_STATUS_WORDS[status].toLowerCase()}.` : 'Paraxia has not sent any mail yet.'}
      />
      <Pager what="messages" page={page} pageSize={PAGE_SIZE} total={mail.data.total} onPage={setPage} />
    </div>
  );
}
