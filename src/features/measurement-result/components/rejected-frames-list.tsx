import type { FrameRejectionReason, SweepResult } from '@shared/schemas/measurement-result';
import { DataTable } from '@/components/ui/data-table';
import { formatFixed } from '@/components/charts/chart-format';
import { REJECTION_REASON_WORDS } from '@/components/charts/sweep-plot-data';

export interface RejectedFramesListProps {
  sweeps: readonly SweepResult[];
  /** Hide the table's caption visually (it stays for screen readers) when a heading above already names it. */
  captionHidden?: boolean;
}

interface RejectedFrameRow {
  sweepNumber: number;
  file: string;
  positionMm: number | null;
  reason: FrameRejectionReason;
  detail: string | null;
}

/** Every frame left out of the analysis, in sweep and rail order, with its reason. */
export function rejectedFrameRows(sweeps: readonly SweepResult[]): RejectedFrameRow[] {
  return sweeps.flatMap((sweep, index) => {
    const positions = new Map((sweep.frames ?? []).map((f) => [f.file, f.positionMm]));
    return sweep.framesRejected
      .map((rejection) => ({
        sweepNumber: index + 1,
        file: rejection.file,
        positionMm: positions.get(rejection.file) ?? null,
        reason: rejection.reason,
        detail: rejection.detail ?? null,
      }))
      .sort((a, b) => (a.positionMm ?? Infinity) - (b.positionMm ?? Infinity) || a.file.localeCompare(b.file));
  });
}

export function RejectedFramesList({ sweeps, captionHidden = false }: RejectedFramesListProps) {
  const rows = rejectedFrameRows(sweeps);
  const total = sweeps.reduce((sum, s) => sum + s.framesUsed + s.framesRejected.length, 0);
  return (
    <DataTable
      caption={`Rejected frames (${rows.length} of ${total})`}
      captionHidden={captionHidden}
      columns={[
        ...(sweeps.length > 1 ? [{ key: 'sweep', header: 'Sweep', cell: (row: RejectedFrameRow) => row.sweepNumber, numeric: true, widthClass: 'w-16' }] : []),
        { key: 'file', header: 'Frame', cell: (row: RejectedFrameRow) => <span className="font-mono text-small">{row.file}</span> },
        {
          key: 'position',
          header: 'Rail position',
          numeric: true,
          cell: (row: RejectedFrameRow) =>
            row.positionMm === null ? (
              '—'
            ) : (
              <>
                {formatFixed(row.positionMm, 3)}
                <span className="ml-1 font-sans font-light text-ink-faint">mm</span>
              </>
            ),
        },
        {
          key: 'reason',
          header: 'Reason',
          cell: (row: RejectedFrameRow) => (
            <span data-reason={row.reason}>
              <span className="text-ink">{capitalise(REJECTION_REASON_WORDS[row.reason])}</span>
              {row.detail ? <span className="text-ink-faint"> · {row.detail}</span> : null}
            </span>
          ),
        },
      ]}
      rows={rows}
      rowKey={(row) => `${row.sweepNumber}-${row.file}`}
      emptyText="Every frame was used."
    />
  );
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
