import { Link } from 'react-router-dom';
import { ConformityMark } from '@/components/ui/conformity-mark';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { Quantity } from '@/components/ui/quantity';
import type { LensMeasurementHistoryItem } from '@shared/schemas/lenses';
import { measurementStatusWords, methodWords } from '@/features/lenses/components/lens-words';

const missing = <span className="text-ink-faint">—</span>;

function columns(linkToMeasurements: boolean): DataTableColumn<LensMeasurementHistoryItem>[] {
  return [
    {
      key: 'number',
      header: 'Measurement',
      cell: (row) =>
        linkToMeasurements ? (
          <Link
            to={`/measurements/${row.id}`}
            className="numerals whitespace-nowrap font-medium text-ink underline decoration-rule-strong underline-offset-4 hover:decoration-ink"
          >
            {row.number}
          </Link>
        ) : (
          <span className="numerals whitespace-nowrap font-medium text-ink">{row.number}</span>
        ),
    },
    { key: 'method', header: 'Method', cell: (row) => methodWords(row.method) },
    {
      key: 'status',
      header: 'Status',
      cell: (row) => (
        <span>
          {measurementStatusWords(row.status)}
          {row.analysisVersion !== null ? <span className="numerals text-caption text-ink-faint"> · run {row.analysisVersion}</span> : null}
        </span>
      ),
    },
    { key: 'measuredOn', header: 'Measured on', cell: (row) => (row.measuredOn ? <span className="numerals">{row.measuredOn}</span> : missing) },
    { key: 'performedBy', header: 'By', cell: (row) => row.performedBy?.name ?? missing },
    {
      key: 'result',
      header: (
        <>
          Result <span className="normal-case">f′ ± U</span>
        </>
      ),
      numeric: true,
      cell: (row) =>
        row.focalLengthMm !== null && row.expandedUncertaintyMm !== null ? (
          <Quantity value={row.focalLengthMm} uncertainty={row.expandedUncertaintyMm} unit="mm" />
        ) : (
          missing
        ),
    },
    {
      key: 'k',
      header: <span className="normal-case">k</span>,
      numeric: true,
      widthClass: 'w-14',
      cell: (row) => (row.coverageFactor !== null ? row.coverageFactor.toFixed(2) : missing),
    },
    { key: 'decision', header: 'Conformity', cell: (row) => (row.decision ? <ConformityMark decision={row.decision} size="sm" /> : missing) },
  ];
}

/** Every measurement of one lens, newest first as the server sends them. */
export function MeasurementHistoryTable({
  measurements,
  linkToMeasurements = true,
}: {
  measurements: readonly LensMeasurementHistoryItem[];
  /** Measurement pages are for lab staff; a client sees the rows without links. */
  linkToMeasurements?: boolean;
}) {
  return (
    <DataTable
      caption="Measurements of this lens"
      captionHidden
      columns={columns(linkToMeasurements)}
      rows={measurements}
      rowKey={(row) => row.id}
      emptyText="This lens has not been measured yet."
    />
  );
}
