import { PageHeader } from '@/components/ui/page-header';

export function AdminOrganisationsRoute() {
  return (
    <div className="space-y-6">
      <title>Organisations · Paraxia</title>
      <PageHeader kicker="Administration" title="Organisations">
        Being built.
      </PageHeader>
    </div>
  );
}
