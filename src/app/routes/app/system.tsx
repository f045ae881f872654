import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { SystemHealthPanel } from '@/features/health/components/system-health-panel';
import { PeopleTable } from '@/features/people/components/people-table';
import { useInvitations } from '@/features/people/api/get-invitations';
import { useOutboundMail } from '@/features/admin-mail/api/get-outbound-mail';
import { useAuditEvents } from '@/features/admin-audit/api/get-audit-events';
import { EMPTY_AUDIT_FILTERS } from '@/features/admin-audit/lib/audit-query';

function SummaryCard({ title, to, linkText, children }: { title: string; to: string; linkText: string; children: ReactNode }) {
  return (
    <div className="flex flex-col justify-between gap-3 rounded-sheet border border-rule bg-sheet px-4 py-3 shadow-sheet">
      <div>
        <h3 className="text-caption font-semibold uppercase tracking-wider text-ink-faint">{title}</h3>
        <div className="mt-1.5 text-small text-ink-soft">{children}</div>
      </div>
      <Link to={to} className="text-small font-medium text-ink underline decoration-rule-strong underline-offset-2 hover:decoration-ink">
        {linkText} →
      </Link>
    </div>
  );
}

function Figure({ value, pending }: { value: number | undefined; pending: boolean }) {
  return <span className="numerals text-title text-ink">{pending || value === undefined ? '…' : value}</span>;
}

function InvitationsSummary() {
  const pending = useInvitations('pending');
  return (
    <SummaryCard title="Invitations" to="/admin/people" linkText="People and invitations">
      <Figure value={pending.data?.length} pending={pending.isPending} /> waiting to be accepted
    </SummaryCard>
  );
}

function MailSummary() {
  const mail = useOutboundMail('', 1, 1);
  const counts = mail.data?.countsByStatus;
  const troubled = counts ? counts.failed + counts.retrying : undefined;
  return (
    <SummaryCard title="Outbound mail" to="/admin/mail" linkText="Outbound mail">
      <Figure value={troubled} pending={mail.isPending} /> failed or waiting to retry
      {counts ? (
        <p className="numerals mt-0.5 text-caption text-ink-faint">
          {counts.sent} sent · {counts.queued + counts.sending} on the way
        </p>
      ) : null}
    </SummaryCard>
  );
}

function FailedSignInsSummary() {
  const today = new Date().toISOString().slice(0, 10);
  const filters = { ...EMPTY_AUDIT_FILTERS, action: 'auth.sign-in-failed', from: today, to: today };
  const failed = useAuditEvents(filters, 1, 1);
  return (
    <SummaryCard title="Audit log" to={`/admin/audit?action=auth.sign-in-failed&from=${today}&to=${today}`} linkText="Failed sign-ins today">
      <Figure value={failed.data?.total} pending={failed.isPending} /> failed sign-ins today (UTC)
    </SummaryCard>
  );
}

export function SystemRoute() {
  return (
    <div className="space-y-8">
      <title>System overview · Paraxia</title>
      <PageHeader kicker="Administration" title="System overview">
        The services Paraxia depends on, who can sign in, and what needs your attention.
      </PageHeader>
      <Section title="Services" description="Checked live every 15 seconds.">
        <RegionErrorBoundary region="Service health">
          <SystemHealthPanel />
        </RegionErrorBoundary>
      </Section>
      <Section title="Needs a look">
        <div className="grid gap-3 sm:grid-cols-3">
          <RegionErrorBoundary region="Invitations">
            <InvitationsSummary />
          </RegionErrorBoundary>
          <RegionErrorBoundary region="Outbound mail">
            <MailSummary />
          </RegionErrorBoundary>
          <RegionErrorBoundary region="Audit log">
            <FailedSignInsSummary />
          </RegionErrorBoundary>
        </div>
        <p className="text-small text-ink-faint">
          Organisations and their contacts: <Link to="/admin/organisations" className="text-ink underline underline-offset-2">Organisations</Link>. Storage use and
          retention: <Link to="/admin/storage" className="text-ink underline underline-offset-2">Storage and retention</Link>.
        </p>
      </Section>
      <Section title="People" description="Active accounts by role; someone who never signed in may not have received their invitation.">
        <RegionErrorBoundary region="People">
          <PeopleTable />
        </RegionErrorBoundary>
      </Section>
    </div>
  );
}
