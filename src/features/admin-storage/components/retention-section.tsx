import { useEffect, useState, type FormEvent } from 'react';
import { RETENTION_DAYS_MAX, RETENTION_DAYS_MIN, type RetentionPreview, type RetentionPurgeResult } from '@shared/schemas/storage';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { ProblemNote } from '@/components/ui/problem-note';
import { Section } from '@/components/ui/section';
import { TextField } from '@/components/ui/text-field';
import { usePreviewRetention } from '@/features/admin-storage/api/preview-retention';
import { usePurgeRawFrames } from '@/features/admin-storage/api/purge-raw-frames';
import { ByteSize, Count } from '@/features/admin-storage/components/byte-size';
import { ConfirmDialog } from '@/features/admin-storage/components/confirm-dialog';
import { plural } from '@/features/admin-storage/lib/plural';

export interface RetentionSectionProps {
  organisationId: string | null;
  scopeName: string;
  defaultDays: number | undefined;
}

function checkDays(text: string): string | null {
  const days = Number(text);
  if (text.trim() === '' || !Number.isInteger(days) || days < RETENTION_DAYS_MIN || days > RETENTION_DAYS_MAX) {
    return `Enter a whole number of days from ${RETENTION_DAYS_MIN} to ${RETENTION_DAYS_MAX}.`;
  }
  return null;
}

/** The retention rule (mount one per scope, keyed by it): preview what it would delete, then purge exactly that after a confirmation naming counts and bytes. */
export function RetentionSection({ organisationId, scopeName, defaultDays }: RetentionSectionProps) {
  const [daysText, setDaysText] = useState('');
  const [fieldError, setFieldError] = useState<string | null>(null);
  const [shown, setShown] = useState<RetentionPreview | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [done, setDone] = useState<RetentionPurgeResult | null>(null);
  const preview = usePreviewRetention();
  const purge = usePurgeRawFrames();

  useEffect(() => {
    if (defaultDays !== undefined && daysText === '') setDaysText(String(defaultDays));
  }, [defaultDays, daysText]);

  const onPreview = (event: FormEvent) => {
    event.preventDefault();
    const problem = checkDays(daysText);
    setFieldError(problem);
    if (problem) return;
    setDone(null);
    purge.reset();
    preview.mutate({ olderThanDays: Number(daysText), organisationId }, { onSuccess: setShown });
  };

  const onConfirm = () => {
    if (!shown) return;
    purge.mutate(shown, {
      onSuccess: (result) => {
        setDone(result);
        setShown(null);
        setConfirming(false);
      },
      onError: () => setConfirming(false),
    });
  };

  return (
    <Section
      title="Retention"
      description="Raw frames of certified measurements are kept until the rule below removes them. Thumbnails, previews, analysis results and certificates always stay."
    >
      <div className="rounded-sheet border border-rule bg-sheet px-5 py-4">
        <form onSubmit={onPreview} className="flex flex-wrap items-end gap-3" noValidate>
          <p className="w-full text-body text-ink-soft">
            Remove the raw frames of measurements whose <em>first</em> certificate was issued more than N days ago ({organisationId ? <>for {scopeName}</> : 'across all storage'}).
            A reissue does not restart the clock; an approved measurement without a certificate is never included.
          </p>
          <TextField
            label="N, days since first certificate"
            inputMode="numeric"
            value={daysText}
            onChange={(event) => setDaysText(event.target.value)}
            error={fieldError ?? undefined}
            className="w-56"
            name="olderThanDays"
          />
          <Button type="submit" variant="secondary" isBusy={preview.isPending}>
            Preview
          </Button>
        </form>
        {preview.error ? (
          <div className="mt-3">
            <ProblemNote title="The preview failed" message={preview.error.message} />
          </div>
        ) : null}
      </div>

      {shown ? (
        <div className="space-y-3" data-testid="retention-preview">
          <div className="flex flex-wrap items-center justify-between gap-3 rounded-sheet border border-rule-strong bg-shade/60 px-4 py-3">
            <p className="text-body">
              {shown.frameCount === 0 ? (
                <>Nothing to purge: no raw frames of measurements first certified more than <Count value={shown.olderThanDays} /> days ago remain.</>
              ) : (
                <>
                  <Count value={shown.frameCount} /> raw {plural(shown.frameCount, 'frame')} of <Count value={shown.measurementCount} />{' '}
                  {plural(shown.measurementCount, 'measurement')},{' '}
                  <ByteSize bytes={shown.bytes} className="font-semibold" />, first certified before{' '}
                  <span className="numerals">{shown.certifiedBefore.slice(0, 10)}</span>.
                </>
              )}
            </p>
            <Button variant="primary" onClick={() => setConfirming(true)} disabled={shown.frameCount === 0}>
              Purge these raw frames…
            </Button>
          </div>
          {shown.measurements.length > 0 ? (
            <DataTable
              caption="Measurements in the preview"
              columns={[
                { key: 'number', header: 'Measurement', widthClass: 'w-36', cell: (row) => <span className="font-mono text-small">{row.number}</span> },
                { key: 'workOrder', header: 'Work order', widthClass: 'w-36', cell: (row) => <span className="font-mono text-small">{row.workOrderNumber}</span> },
                { key: 'client', header: 'Client', cell: (row) => row.organisationName },
                { key: 'certified', header: 'First certified', widthClass: 'w-32', numeric: true, cell: (row) => row.certifiedAt.slice(0, 10) },
                { key: 'frames', header: 'Raw frames', numeric: true, widthClass: 'w-24', cell: (row) => <Count value={row.frameCount} /> },
                { key: 'bytes', header: 'Bytes', numeric: true, widthClass: 'w-28', cell: (row) => <ByteSize bytes={row.bytes} /> },
              ]}
              rows={shown.measurements}
              rowKey={(row) => row.measurementId}
            />
          ) : null}
        </div>
      ) : null}

      {purge.error ? <ProblemNote title="Nothing was purged" message={purge.error.message} /> : null}
      {done ? (
        <div role="status" className="rounded-sheet border border-rule-strong bg-sheet px-4 py-3 text-body">
          Purged <Count value={done.purgedFrameCount} /> raw {plural(done.purgedFrameCount, 'frame')} of <Count value={done.measurementCount} />{' '}
          {plural(done.measurementCount, 'measurement')}, freeing{' '}
          <ByteSize bytes={done.purgedBytes} className="font-semibold" />. Their thumbnails, previews, results and certificates remain.
          {done.failures.length > 0 ? (
            <p className="mt-2 text-small text-nonconform">
              <Count value={done.failures.length} /> {plural(done.failures.length, 'frame')} could not be deleted and were left as they were (first: {done.failures[0].fileName},{' '}
              {done.failures[0].message}). Preview again to retry them.
            </p>
          ) : null}
        </div>
      ) : null}

      <ConfirmDialog
        open={confirming && shown !== null}
        title="Purge raw frames?"
        confirmLabel={shown ? `Purge ${shown.frameCount} raw ${plural(shown.frameCount, 'frame')}` : 'Purge'}
        isBusy={purge.isPending}
        onConfirm={onConfirm}
        onCancel={() => setConfirming(false)}
      >
        {shown ? (
          <>
            <p>
              This deletes the original files of <strong className="numerals">{shown.frameCount}</strong> {plural(shown.frameCount, 'frame')} from{' '}
              <strong className="numerals">{shown.measurementCount}</strong> certified {plural(shown.measurementCount, 'measurement')}, freeing{' '}
              <ByteSize bytes={shown.bytes} className="font-semibold" />. It cannot be undone.
            </p>
            <p>Thumbnails, previews, analysis results and certificates stay, so results can still be reviewed and verified; the originals can no longer be downloaded or re-analysed.</p>
            <p className="text-small text-ink-faint">If the set has changed since this preview, the server refuses and nothing is deleted.</p>
          </>
        ) : null}
      </ConfirmDialog>
    </Section>
  );
}
