import type { Frame } from '@shared/schemas/frames';
import { formatFixed } from '@/components/charts/chart-format';
import { DataTable, type DataTableColumn } from '@/components/ui/data-table';
import { formatBytes } from '@/features/measurements/components/upload-list';
import type { ReadingsPreview } from '@/features/measurements/utils/readings-preview';

export interface FramesTableProps {
  sweepLabel: string;
  frames: readonly Frame[];
  /** Readings an entry would give, shown beside the stored ones before saving. */
  preview: ReadingsPreview | null;
  /** When set, the reading cells are inputs holding these texts, by file name. */
  editedCells: Record<string, string> | null;
  onEditCell: (fileName: string, text: string) => void;
  /** Sentences by file name, from the preview or the server. */
  rowProblems: Record<string, string>;
  canChange: boolean;
  onToggleExcluded: (frame: Frame) => void;
  togglingFrameId: string | null;
  onRemove: ((frame: Frame) => void) | null;
  onOpenPreview: (frame: Frame) => void;
}

function ReadingText({ positionMm }: { positionMm: number | null }) {
  if (positionMm === null) return <span className="text-ink-faint">—</span>;
  return (
    <>
      {formatFixed(positionMm, 3)}
      <span className="ml-1 font-sans font-light text-ink-faint">mm</span>
    </>
  );
}

/** A sweep's frames in file-name order: thumbnail, file, rail reading, image size, bit depth, and whether the next analysis uses it. */
export function FramesTable({
  sweepLabel,
  frames,
  preview,
  editedCells,
  onEditCell,
  rowProblems,
  canChange,
  onToggleExcluded,
  togglingFrameId,
  onRemove,
  onOpenPreview,
}: FramesTableProps) {
  const previewByName = new Map(preview?.rows.map((row) => [row.fileName, row]) ?? []);
  const columns: DataTableColumn<Frame>[] = [
    {
      key: 'thumbnail',
      header: <span className="sr-only">Thumbnail</span>,
      widthClass: 'w-16',
      cell: (frame) => (
        <button
          type="button"
          onClick={() => onOpenPreview(frame)}
          className="-my-1 inline-block h-7 w-9 overflow-hidden rounded-hair border border-rule bg-shade align-middle"
          aria-label={`Open ${frame.fileName}`}
        >
          <img src={frame.thumbnailUrl} alt="" loading="lazy" className="h-full w-full object-cover" />
        </button>
      ),
    },
    {
      key: 'file',
      header: 'File',
      cell: (frame) => (
        <span className="font-mono text-small text-ink">
          {frame.fileName}
          {rowProblems[frame.fileName] ? (
            <span className="mt-0.5 block font-sans text-caption text-nonconform" data-role="row-problem">
              {rowProblems[frame.fileName]}
            </span>
          ) : null}
        </span>
      ),
    },
    {
      key: 'reading',
      header: 'Rail reading',
      numeric: true,
      widthClass: 'w-40',
      cell: (frame) =>
        editedCells ? (
          <input
            aria-label={`Rail reading of ${frame.fileName} in mm`}
            inputMode="decimal"
            value={editedCells[frame.fileName] ?? (frame.positionMm === null ? '' : String(frame.positionMm))}
            onChange={(event) => onEditCell(frame.fileName, event.target.value)}
            aria-invalid={rowProblems[frame.fileName] ? true : undefined}
            className={`numerals h-7 w-28 rounded-hair border bg-sheet px-2 text-right text-small ${rowProblems[frame.fileName] ? 'border-nonconform' : 'border-rule-strong'}`}
          />
        ) : (
          <ReadingText positionMm={frame.positionMm} />
        ),
    },
  ];
  if (preview && !editedCells) {
    columns.push({
      key: 'new-reading',
      header: 'New reading',
      numeric: true,
      widthClass: 'w-36',
      cell: (frame) => {
        const row = previewByName.get(frame.fileName);
        if (!row || row.positionMm === null) return <span className="text-nonconform">none</span>;
        return (
          <span className={row.changed ? 'font-semibold text-ink' : 'text-ink-faint'} data-changed={row.changed || undefined}>
            <ReadingText positionMm={row.positionMm} />
          </span>
        );
      },
    });
  }
  columns.push(
    { key: 'size', header: 'Size', numeric: true, widthClass: 'w-32', cell: (frame) => `${frame.widthPx} × ${frame.heightPx}` },
    { key: 'depth', header: 'Bits', numeric: true, widthClass: 'w-14', cell: (frame) => frame.bitDepth },
    { key: 'bytes', header: 'File', numeric: true, widthClass: 'w-20', cell: (frame) => formatBytes(frame.byteSize) },
    {
      key: 'use',
      header: 'Use',
      widthClass: 'w-32',
      cell: (frame) => (
        <label className={`inline-flex items-center gap-1.5 text-small ${canChange ? 'cursor-pointer' : 'cursor-not-allowed'}`}>
          <input
            type="checkbox"
            checked={!frame.excluded}
            disabled={!canChange || togglingFrameId === frame.id}
            onChange={() => onToggleExcluded(frame)}
            className="size-4 accent-[var(--color-ink)]"
            aria-label={`Use ${frame.fileName} in the next analysis`}
          />
          <span className={frame.excluded ? 'font-medium text-ink' : 'text-ink-faint'}>{frame.excluded ? 'excluded' : 'in analysis'}</span>
        </label>
      ),
    },
  );
  if (onRemove) {
    columns.push({
      key: 'remove',
      header: <span className="sr-only">Remove</span>,
      widthClass: 'w-10',
      cell: (frame) => (
        <button
          type="button"
          onClick={() => onRemove(frame)}
          className="rounded-hair px-1 text-caption text-ink-faint underline-offset-2 hover:text-nonconform hover:underline"
          aria-label={`Remove ${frame.fileName} from the sweep`}
        >
          remove
        </button>
      ),
    });
  }

  return (
    <DataTable
      caption={`Frames of ${sweepLabel}`}
      captionHidden
      columns={columns}
      rows={frames}
      rowKey={(frame) => frame.id}
      isRowMuted={(frame) => frame.excluded}
      emptyText="No frames yet. Drop the sweep’s images above."
    />
  );
}
