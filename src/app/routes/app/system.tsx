import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { SystemHealthPanel } from '@/features/health/components/system-health-panel';
import { PeopleTable } from '@/features/people/components/people-table';

export function SystemRoute() {
  return (
    <div className="space-y-8">
      <title>System overview · Paraxia</title>
      <PageHeader kicker="Administration" title="System overview">
        The services Paraxia depends on, and the people who can sign in.
      </PageHeader>
      <Section title="Services" description="Checked live every 15 seconds.">
        <RegionErrorBoundary region="Service health">
          <SystemHealthPanel />
        </RegionErrorBoundary>
      </Section>
      <Section title="People" description="Everyone with a sign-in, lab staff and client contacts alike.">
        <RegionErrorBoundary region="People">
          <PeopleTable />
        </RegionErrorBoundary>
      </Section>
    </div>
  );
}
