import { PageHeader } from '@/components/ui/page-header';

export function ChoosePasswordRoute() {
  return (
    <div className="space-y-6">
      <title>Choose a new password · Paraxia</title>
      <PageHeader kicker="Paraxia" title="Choose a new password">
        Being built.
      </PageHeader>
    </div>
  );
}
