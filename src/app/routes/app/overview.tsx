import { Navigate } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { chooseHome, type RoleHome } from '@/lib/authorization';
import type { User } from '@/types/api';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { ClientOrdersPanel } from '@/features/client-orders/components/client-orders-panel';
import { SystemHealthPanel } from '@/features/health/components/system-health-panel';
import { OpenWorkPanel } from '@/features/open-work/components/open-work-panel';
import { MeasurementStatusMark } from '@/features/measurements/components/measurement-status-mark';
import { PeopleTable } from '@/features/people/components/people-table';
import { ReviewQueuePanel } from '@/features/review-queue/components/review-queue-panel';

function RolePanel({ home, user }: { home: RoleHome; user: User }) {
  switch (home.role) {
    case 'technician':
      return <OpenWorkPanel statusMark={(status) => <MeasurementStatusMark status={status} />} />;
    case 'reviewer':
      return <ReviewQueuePanel />;
    case 'client':
      return <ClientOrdersPanel organisationName={user.organisation?.name ?? null} />;
    case 'admin':
      return (
        <div className="space-y-4">
          <SystemHealthPanel />
          <PeopleTable />
        </div>
      );
  }
}

/** `/`: one role goes straight to its home page; several roles see their homes one under another. */
export function OverviewRoute() {
  const { data: user } = useCurrentUser();
  if (!user) return null;
  const choice = chooseHome(user);

  if (choice.kind === 'single') return <Navigate to={choice.home.path} replace />;
  if (choice.kind === 'no-role') {
    return (
      <div className="space-y-6">
        <title>Paraxia</title>
        <PageHeader title={`Welcome, ${user.name}`}>
          Your sign-in works, but it has no role yet, so there is nothing to show. Ask your lab’s administrator to give
          you the role you need: technician, reviewer, client or administrator.
        </PageHeader>
      </div>
    );
  }
  return (
    <div className="space-y-10">
      <title>Overview · Paraxia</title>
      <PageHeader kicker="Overview" title={`Everything on your desk, ${user.name.split(' ')[0]}`}>
        You hold several roles; each has its own page in the margin. Here they are together.
      </PageHeader>
      {choice.homes.map((home) => (
        <Section key={home.role} title={home.label}>
          <RegionErrorBoundary region={home.label}>
            <RolePanel home={home} user={user} />
          </RegionErrorBoundary>
        </Section>
      ))}
    </div>
  );
}
