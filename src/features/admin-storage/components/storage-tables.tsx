import type { MeasurementStorage, OrganisationStorage, StorageBreakdown, StoragePage, WorkOrderStorage } from '@shared/schemas/storage';
import { Link } from 'react-router-dom';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { Button } from '@/components/ui/button';
import { ByteSize, Count } from '@/features/admin-storage/components/byte-size';

/** Zero shows as a dash so the columns with something in them stand out. */
function BytesCell({ bytes, className }: { bytes: number; className?: string }) {
  return bytes === 0 ? <span className="text-ink-faint">–</span> : <ByteSize bytes={bytes} className={className} />;
}

function sizeColumns<Row extends StorageBreakdown>(): DataTableColumn<Row>[] {
  return [
    { key: 'objects', header: 'Objects', numeric: true, widthClass: 'w-20', cell: (row) => <Count value={row.objectCount} /> },
    { key: 'raw', header: 'Raw frames', numeric: true, widthClass: 'w-28', cell: (row) => <BytesCell bytes={row.byKind['raw-frames'].bytes} /> },
    { key: 'renditions', header: 'Thumbs + previews', numeric: true, widthClass: 'w-32', cell: (row) => <BytesCell bytes={row.byKind.renditions.bytes} /> },
    { key: 'certificates', header: 'Certificates', numeric: true, widthClass: 'w-28', cell: (row) => <BytesCell bytes={row.byKind.certificates.bytes} /> },
    { key: 'other', header: 'Other', numeric: true, widthClass: 'w-24', cell: (row) => <BytesCell bytes={row.byKind.other.bytes} /> },
    { key: 'total', header: 'Total', numeric: true, widthClass: 'w-28', cell: (row) => <ByteSize bytes={row.bytes} className="font-semibold" /> },
  ];
}

const unknownRecord = <span className="text-ink-faint">no record</span>;

export function OrganisationStorageTable({
  rows,
  chosenId,
  onChoose,
}: {
  rows: OrganisationStorage[];
  chosenId: string | null;
  onChoose: (organisationId: string | null) => void;
}) {
  const columns: DataTableColumn<OrganisationStorage>[] = [
    {
      key: 'organisation',
      header: 'Organisation',
      cell: (row) =>
        row.organisationId === chosenId ? (
          <span className="font-semibold">{row.name ?? unknownRecord}</span>
        ) : (
          <button type="button" className="text-left underline decoration-rule-strong underline-offset-2 hover:decoration-ink" onClick={() => onChoose(row.organisationId)}>
            {row.name ?? 'Organisation without a record'}
          </button>
        ),
    },
    ...sizeColumns<OrganisationStorage>(),
  ];
  return (
    <DataTable
      caption="By organisation"
      columns={columns}
      rows={rows}
      rowKey={(row) => row.organisationId}
      emptyText="No organisation has objects in storage yet."
    />
  );
}

export function StoragePager({ page, label, onPage }: { page: StoragePage<unknown>; label: string; onPage: (page: number) => void }) {
  const pageCount = Math.max(1, Math.ceil(page.total / page.pageSize));
  if (pageCount <= 1) return null;
  const first = (page.page - 1) * page.pageSize + 1;
  const last = Math.min(page.total, page.page * page.pageSize);
  return (
    <nav aria-label={`Pages of ${label}`} className="flex items-center justify-end gap-2 text-small">
      <span className="numerals text-ink-soft">
        {first}–{last} of {page.total}
      </span>
      <Button variant="secondary" size="sm" onClick={() => onPage(page.page - 1)} disabled={page.page <= 1}>
        ‹ Previous
      </Button>
      <Button variant="secondary" size="sm" onClick={() => onPage(page.page + 1)} disabled={page.page >= pageCount}>
        Next ›
      </Button>
    </nav>
  );
}

export function WorkOrderStorageTable({ page, onPage }: { page: StoragePage<WorkOrderStorage>; onPage: (page: number) => void }) {
  const columns: DataTableColumn<WorkOrderStorage>[] = [
    {
      key: 'number',
      header: 'Work order',
      widthClass: 'w-36',
      cell: (row) => (row.number ? <Link to={`/work-orders/${row.workOrderId}`} className="whitespace-nowrap font-mono text-small underline decoration-rule-strong underline-offset-2 hover:decoration-ink">{row.number}</Link> : unknownRecord),
    },
    { key: 'title', header: 'Title', cell: (row) => <span className="block max-w-64 truncate" title={row.title ?? undefined}>{row.title ?? '—'}</span> },
    { key: 'organisation', header: 'Client', cell: (row) => row.organisationName ?? unknownRecord },
    ...sizeColumns<WorkOrderStorage>(),
  ];
  return (
    <div className="space-y-2">
      <DataTable caption={`By work order, largest first (${page.total})`} columns={columns} rows={page.items} rowKey={(row) => row.workOrderId} emptyText="No work order has objects in storage." />
      <StoragePager page={page} label="work orders" onPage={onPage} />
    </div>
  );
}

export function MeasurementStorageTable({ page, onPage }: { page: StoragePage<MeasurementStorage>; onPage: (page: number) => void }) {
  const columns: DataTableColumn<MeasurementStorage>[] = [
    {
      key: 'number',
      header: 'Measurement',
      widthClass: 'w-36',
      cell: (row) => (row.number ? <Link to={`/measurements/${row.measurementId}`} className="whitespace-nowrap font-mono text-small underline decoration-rule-strong underline-offset-2 hover:decoration-ink">{row.number}</Link> : unknownRecord),
    },
    { key: 'workOrder', header: 'Work order', widthClass: 'w-36', cell: (row) => <span className="whitespace-nowrap font-mono text-small">{row.workOrderNumber ?? '—'}</span> },
    { key: 'status', header: 'Status', widthClass: 'w-24', cell: (row) => row.status ?? '—' },
    ...sizeColumns<MeasurementStorage>(),
  ];
  return (
    <div className="space-y-2">
      <DataTable caption={`By measurement, largest first (${page.total})`} columns={columns} rows={page.items} rowKey={(row) => row.measurementId} emptyText="No measurement has objects in storage." />
      <StoragePager page={page} label="measurements" onPage={onPage} />
    </div>
  );
}
