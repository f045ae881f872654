import { useId } from 'react';
import { useSearchParams } from 'react-router-dom';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { Section } from '@/components/ui/section';
import { useStorageSettings } from '@/features/admin-storage/api/get-storage-settings';
import { useStorageUsage } from '@/features/admin-storage/api/get-storage-usage';
import { OrphansSection } from '@/features/admin-storage/components/orphans-section';
import { RetentionSection } from '@/features/admin-storage/components/retention-section';
import { MeasurementStorageTable, OrganisationStorageTable, WorkOrderStorageTable } from '@/features/admin-storage/components/storage-tables';
import { StorageTotals } from '@/features/admin-storage/components/storage-totals';

const PAGE_SIZE = 15;

function positivePage(text: string | null): number {
  const page = Number(text);
  return Number.isInteger(page) && page >= 1 ? page : 1;
}

/** Storage accounting, retention and orphan objects; the scope (all, or one organisation) lives in the URL. */
export function StoragePage() {
  const [params, setParams] = useSearchParams();
  const organisationId = params.get('organisation');
  const workOrderPage = positivePage(params.get('workOrderPage'));
  const measurementPage = positivePage(params.get('measurementPage'));
  const scopeId = useId();
  const settings = useStorageSettings();
  const usage = useStorageUsage({ organisationId, workOrderPage, measurementPage, pageSize: PAGE_SIZE });

  const update = (changes: Record<string, string | null>) => {
    const next = new URLSearchParams(params);
    for (const [name, value] of Object.entries(changes)) {
      if (value === null) next.delete(name);
      else next.set(name, value);
    }
    setParams(next, { replace: false });
  };
  const chooseOrganisation = (id: string | null) => update({ organisation: id, workOrderPage: null, measurementPage: null });

  const organisations = usage.data?.organisations ?? [];
  const chosenName = organisationId ? (organisations.find((row) => row.organisationId === organisationId)?.name ?? 'One organisation') : null;
  const scopeName = chosenName ?? 'All storage';

  return (
    <div className="space-y-8">
      <div className="flex flex-wrap items-end gap-3">
        <label htmlFor={scopeId} className="text-small font-medium text-ink">
          Scope
        </label>
        <select
          id={scopeId}
          value={organisationId ?? ''}
          onChange={(event) => chooseOrganisation(event.target.value || null)}
          className="h-10 min-w-64 rounded-sheet border border-rule-strong bg-sheet px-3 text-body"
        >
          <option value="">All storage</option>
          {organisationId && !organisations.some((row) => row.organisationId === organisationId) ? <option value={organisationId}>One organisation</option> : null}
          {organisations.map((row) => (
            <option key={row.organisationId} value={row.organisationId}>
              {row.name ?? `Organisation without a record (${row.organisationId.slice(0, 8)})`}
            </option>
          ))}
        </select>
        <p className="pb-2 text-small text-ink-faint">Applies to the tables, the retention preview and the search for objects without a record.</p>
      </div>

      <Section title="Use" description="Summed from object storage itself, grouped by the folder each object sits in, then matched to its records.">
        {usage.isPending ? <LoadingNote what="storage use" /> : null}
        {usage.error ? <ProblemNote title="Storage use could not be read" message={usage.error.message} /> : null}
        {usage.data ? (
          <div data-testid="storage-use" data-stale={usage.isPlaceholderData || undefined} className={`space-y-5 ${usage.isPlaceholderData ? 'opacity-70' : ''}`}>
            <StorageTotals totals={usage.data.totals} outsideOrganisations={usage.data.outsideOrganisations} scopeName={scopeName} scannedAt={usage.data.scannedAt} />
            <OrganisationStorageTable rows={usage.data.organisations} chosenId={organisationId} onChoose={chooseOrganisation} />
            <WorkOrderStorageTable page={usage.data.workOrders} onPage={(page) => update({ workOrderPage: String(page) })} />
            <MeasurementStorageTable page={usage.data.measurements} onPage={(page) => update({ measurementPage: String(page) })} />
          </div>
        ) : null}
      </Section>

      <RetentionSection key={`retention-${organisationId ?? 'all'}`} organisationId={organisationId} scopeName={scopeName} defaultDays={settings.data?.retentionDefaultDays} />
      <OrphansSection key={`orphans-${organisationId ?? 'all'}`} organisationId={organisationId} scopeName={scopeName} minimumAgeMinutes={settings.data?.orphanMinimumAgeMinutes} />
    </div>
  );
}
