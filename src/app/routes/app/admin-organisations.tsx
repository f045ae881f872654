import { useSearchParams } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { OrganisationDetailPanel } from '@/features/admin-organisations/components/organisation-detail';
import { OrganisationsList } from '@/features/admin-organisations/components/organisations-list';

export function AdminOrganisationsRoute() {
  const [searchParams, setSearchParams] = useSearchParams();
  const selectedId = searchParams.get('organisation');
  return (
    <div className="space-y-6">
      <title>Organisations · Paraxia</title>
      <PageHeader kicker="Administration" title="Organisations">
        The lab and the clients it measures for. Contacts receive the certificate e-mails; people who sign in for a
        client are invited from the People page.
      </PageHeader>
      <div className="grid gap-6 lg:grid-cols-[minmax(16rem,22rem)_1fr]">
        <RegionErrorBoundary region="Organisations">
          <OrganisationsList selectedId={selectedId} onSelect={(id) => setSearchParams({ organisation: id })} />
        </RegionErrorBoundary>
        <RegionErrorBoundary region="Organisation">
          {selectedId ? (
            <OrganisationDetailPanel key={selectedId} organisationId={selectedId} />
          ) : (
            <p className="self-start rounded-sheet border border-dashed border-rule-strong bg-sheet/70 px-5 py-8 text-body text-ink-soft">
              Choose an organisation on the left to see and change its contacts.
            </p>
          )}
        </RegionErrorBoundary>
      </div>
    </div>
  );
}
