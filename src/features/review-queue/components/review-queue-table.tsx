import { Link } from 'react-router-dom';
import type { ReviewQueueItem } from '@shared/schemas/review';
import { DataTable } from '@/components/ui/data-table';
import { Quantity } from '@/components/ui/quantity';

/** "3 h 20 min", "2 d 4 h": how long a measurement has waited. */
export function formatWaiting(seconds: number): string {
  const minutes = Math.floor(seconds / 60);
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return `${hours} h ${minutes % 60} min`;
  return `${Math.floor(hours / 24)} d ${hours % 24} h`;
}

export function ReviewQueueTable({ caption, rows, emptyText, since }: { caption: string; rows: ReviewQueueItem[]; emptyText: string; since: 'submitted' | 'approved' }) {
  return (
    <DataTable
      caption={caption}
      rows={rows}
      rowKey={(row) => row.measurementId}
      emptyText={emptyText}
      columns={[
        {
          key: 'measurement',
          header: 'Measurement',
          cell: (row) => (
            <Link to={`/measurements/${row.measurementId}`} className="numerals underline decoration-rule-strong underline-offset-4 hover:text-ink">
              {row.number}
            </Link>
          ),
        },
        { key: 'workOrder', header: 'Work order', cell: (row) => <span className="numerals">{row.workOrder.number}</span> },
        { key: 'lens', header: 'Lens', cell: (row) => <span className="numerals">{row.lens.identifier}</span> },
        { key: 'client', header: 'Client', cell: (row) => row.client.name },
        { key: 'technician', header: 'Performed by', cell: (row) => row.performedBy?.name ?? '—' },
        ...(since === 'approved' ? [{ key: 'approver', header: 'Approved by', cell: (row: ReviewQueueItem) => row.approvedBy?.name ?? '—' }] : []),
        {
          key: 'focal',
          header: 'f ± U',
          numeric: true,
          cell: (row) =>
            row.focalLengthMm === null ? '—' : <Quantity value={row.focalLengthMm} uncertainty={row.expandedUncertaintyMm ?? undefined} unit="mm" />,
        },
        { key: 'waiting', header: 'Waiting', numeric: true, cell: (row) => <span className="numerals">{formatWaiting(row.waitingSeconds)}</span> },
      ]}
    />
  );
}
