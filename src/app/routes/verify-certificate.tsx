import { PageHeader } from '@/components/ui/page-header';

export function VerifyCertificateRoute() {
  return (
    <div className="space-y-6">
      <title>Verify a certificate · Paraxia</title>
      <PageHeader kicker="Paraxia" title="Verify a certificate">
        Being built.
      </PageHeader>
    </div>
  );
}
