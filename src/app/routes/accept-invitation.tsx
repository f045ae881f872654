import { PageHeader } from '@/components/ui/page-header';

export function AcceptInvitationRoute() {
  return (
    <div className="space-y-6">
      <title>Accept your invitation · Paraxia</title>
      <PageHeader kicker="Paraxia" title="Accept your invitation">
        Being built.
      </PageHeader>
    </div>
  );
}
