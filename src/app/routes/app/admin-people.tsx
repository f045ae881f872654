import { PageHeader } from '@/components/ui/page-header';

export function AdminPeopleRoute() {
  return (
    <div className="space-y-6">
      <title>People · Paraxia</title>
      <PageHeader kicker="Administration" title="People">
        Being built.
      </PageHeader>
    </div>
  );
}
