import { Link } from 'react-router-dom';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import type { LensSummary } from '@shared/schemas/lenses';
import { LatestMeasurementCell } from '@/features/lenses/components/latest-measurement-cell';
import { LensKindMark } from '@/features/lenses/components/lens-kind-mark';
import { LensNominal, LensTolerance } from '@/features/lenses/components/lens-nominal';

export interface LensesTableProps {
  lenses: readonly LensSummary[];
  /** Technicians start measurements; others see the table without the action. */
  canStartMeasurement: boolean;
  /** Measurement pages are for lab staff; a client sees the number and result without a link. */
  canOpenMeasurements?: boolean;
  emptyText?: string;
}

/** The lenses of one work order, each with its nominal, tolerance and newest result. */
export function LensesTable({ lenses, canStartMeasurement, canOpenMeasurements = true, emptyText = 'No lenses on this work order yet.' }: LensesTableProps) {
  const columns: DataTableColumn<LensSummary>[] = [
    {
      key: 'identifier',
      header: 'Identifier',
      cell: (lens) => (
        <Link to={`/lenses/${lens.id}`} className="numerals whitespace-nowrap font-medium text-ink underline decoration-rule-strong underline-offset-4 hover:decoration-ink">
          {lens.identifier}
        </Link>
      ),
    },
    {
      key: 'description',
      header: 'Description',
      cell: (lens) => (
        <span className="block max-w-[16rem]">
          <span className="block">{lens.description || <span className="text-ink-faint">—</span>}</span>
          {lens.partNumber ? <span className="numerals block text-caption text-ink-faint">part {lens.partNumber}</span> : null}
        </span>
      ),
    },
    { key: 'nominal', header: 'Nominal', numeric: true, cell: (lens) => <LensNominal lens={lens} /> },
    { key: 'tolerance', header: 'Tolerance', numeric: true, cell: (lens) => <LensTolerance lens={lens} /> },
    { key: 'kind', header: 'Kind', cell: (lens) => <LensKindMark kind={lens.kind} /> },
    { key: 'latest', header: 'Latest measurement', cell: (lens) => <LatestMeasurementCell measurement={lens.latestMeasurement} linkToMeasurement={canOpenMeasurements} /> },
  ];
  if (canStartMeasurement) {
    columns.push({
      key: 'action',
      header: <span className="sr-only">Action</span>,
      widthClass: 'w-36',
      cell: (lens) => (
        <Link
          to={`/measurements/new?lensId=${encodeURIComponent(lens.id)}`}
          className="inline-flex h-8 items-center whitespace-nowrap rounded-sheet border border-rule-strong bg-sheet px-2.5 text-small font-medium text-ink hover:bg-shade"
        >
          New measurement
        </Link>
      ),
    });
  }
  return <DataTable caption="Lenses on this work order" captionHidden columns={columns} rows={lenses} rowKey={(lens) => lens.id} emptyText={emptyText} />;
}
