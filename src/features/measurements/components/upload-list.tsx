import { Button } from '@/components/ui/button';
import { CircleTickGlyph, SquareCrossGlyph } from '@/components/ui/mark-glyphs';
import type { RefusedFile } from '@/features/measurements/hooks/use-frame-uploads';
import type { UploadEntry, UploadSummary } from '@/features/measurements/utils/upload-queue';

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

function percent(entry: UploadEntry): number {
  if (entry.status === 'done') return 100;
  if (entry.totalBytes <= 0) return 0;
  return Math.min(100, Math.floor((entry.sentBytes / entry.totalBytes) * 100));
}

const STATUS_WORDS: Record<UploadEntry['status'], string> = {
  waiting: 'waiting',
  uploading: 'sending',
  done: 'stored',
  failed: 'failed',
};

const DISPLAY_ORDER: Record<UploadEntry['status'], number> = { failed: 0, uploading: 1, waiting: 2, done: 3 };

/** Failed files first (they need a person), then those moving, then waiting; stored ones last. */
export function entriesForDisplay(entries: readonly UploadEntry[], active: boolean): UploadEntry[] {
  const shown = active ? [...entries] : entries.filter((entry) => entry.status === 'failed');
  return shown.sort((a, b) => DISPLAY_ORDER[a.status] - DISPLAY_ORDER[b.status]);
}

function statusWord(entry: UploadEntry): string {
  // Every byte sent but no answer yet: the server is checking the image and making its thumbnail.
  if (entry.status === 'uploading' && entry.totalBytes > 0 && entry.sentBytes >= entry.totalBytes) return 'checking';
  return STATUS_WORDS[entry.status];
}

export interface UploadListProps {
  entries: readonly UploadEntry[];
  summary: UploadSummary;
  refused: RefusedFile[];
  onRetry: (id: string) => void;
  onClearFinished: () => void;
}

/** Every file of a drop with its own progress bar; a failed file shows the server's sentence and can be sent again. */
export function UploadList({ entries, summary, refused, onRetry, onClearFinished }: UploadListProps) {
  if (entries.length === 0 && refused.length === 0) return null;
  const active = summary.waiting + summary.uploading;
  const shown = entriesForDisplay(entries, active > 0);
  return (
    <div className="space-y-2" data-role="upload-list">
      <div className="flex flex-wrap items-center gap-3 text-small">
        <p role="status" aria-live="polite" className="text-ink-soft">
          {active > 0 ? (
            <>
              Uploading <span className="numerals text-ink">{summary.done}</span> of <span className="numerals text-ink">{summary.count}</span> stored
              {summary.failed > 0 ? <>, <span className="numerals text-nonconform">{summary.failed}</span> failed</> : null} ·{' '}
              <span className="numerals">{Math.floor(summary.fraction * 100)} %</span> of {formatBytes(summary.totalBytes)}
            </>
          ) : entries.length > 0 ? (
            <>
              <span className="numerals text-ink">{summary.done}</span> of <span className="numerals text-ink">{summary.count}</span> files stored
              {summary.failed > 0 ? (
                <>
                  ; <span className="numerals text-nonconform">{summary.failed}</span> failed — retry {summary.failed === 1 ? 'it' : 'each'} below
                </>
              ) : (
                ' and listed in the table below'
              )}
              .
            </>
          ) : null}
        </p>
        {active === 0 ? (
          <Button variant="quiet" size="sm" className="ml-auto" onClick={onClearFinished}>
            Clear this list
          </Button>
        ) : null}
      </div>

      {refused.length > 0 ? (
        <ul className="space-y-1 rounded-sheet border border-nonconform/40 bg-nonconform-tint/40 px-3 py-2 text-small" aria-label="Files not sent">
          {refused.map((file, index) => (
            <li key={`${file.fileName}-${index}`} className="flex gap-2">
              <SquareCrossGlyph className="mt-0.5 size-3.5 shrink-0 text-nonconform" />
              <span className="text-ink">{file.message}</span>
            </li>
          ))}
        </ul>
      ) : null}

      {shown.length > 0 ? (
        <ul className="max-h-72 divide-y divide-rule overflow-y-auto rounded-sheet border border-rule bg-sheet" aria-label="Uploads">
          {shown.map((entry) => (
            <li key={entry.id} className="grid grid-cols-[minmax(0,14rem)_minmax(6rem,1fr)_auto] items-center gap-x-3 px-3 py-1.5 text-small" data-upload={entry.status}>
              <span className="truncate font-mono text-ink" title={entry.fileName}>
                {entry.fileName}
              </span>
              {entry.status === 'failed' ? (
                <span className="flex min-w-0 items-start gap-1.5 text-nonconform" role="alert">
                  <SquareCrossGlyph className="mt-0.5 size-3.5 shrink-0" />
                  <span className="text-ink">{entry.message}</span>
                </span>
              ) : (
                <span className="flex items-center gap-2">
                  <span
                    role="progressbar"
                    aria-label={`Upload of ${entry.fileName}`}
                    aria-valuemin={0}
                    aria-valuemax={100}
                    aria-valuenow={percent(entry)}
                    className="relative h-1.5 flex-1 overflow-hidden rounded-full bg-shade"
                  >
                    <span
                      className={`absolute inset-y-0 left-0 rounded-full ${entry.status === 'done' ? 'bg-ink-soft' : 'bg-ink'}`}
                      style={{ width: `${percent(entry)}%` }}
                    />
                  </span>
                  <span className="numerals w-10 text-right text-caption text-ink-faint">{percent(entry)} %</span>
                </span>
              )}
              <span className="flex items-center justify-end gap-2 whitespace-nowrap text-caption text-ink-faint">
                <span className="numerals">{formatBytes(entry.byteSize)}</span>
                {entry.status === 'done' ? (
                  <span className="inline-flex items-center gap-1 text-ink-soft">
                    <CircleTickGlyph className="size-3.5" />
                    {STATUS_WORDS.done}
                  </span>
                ) : entry.status === 'failed' ? (
                  <Button variant="secondary" size="sm" onClick={() => onRetry(entry.id)} aria-label={`Retry ${entry.fileName}`}>
                    Retry
                  </Button>
                ) : (
                  <span className="w-14">{statusWord(entry)}</span>
                )}
              </span>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
