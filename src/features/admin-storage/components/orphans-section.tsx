import { useState } from 'react';
import type { OrphanList, OrphanRemovalResult } from '@shared/schemas/storage';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { ProblemNote } from '@/components/ui/problem-note';
import { Section } from '@/components/ui/section';
import { useFindOrphanObjects } from '@/features/admin-storage/api/get-orphan-objects';
import { useRemoveOrphanObjects } from '@/features/admin-storage/api/remove-orphan-objects';
import { ByteSize, Count } from '@/features/admin-storage/components/byte-size';
import { ConfirmDialog } from '@/features/admin-storage/components/confirm-dialog';
import { plural } from '@/features/admin-storage/lib/plural';

const KEPT_WORDS: Record<OrphanRemovalResult['kept'][number]['reason'], string> = {
  'has-record': 'gained a database record',
  missing: 'was already gone',
  'too-young': 'is too recent',
  'delete-failed': 'could not be deleted',
};

export interface OrphansSectionProps {
  organisationId: string | null;
  scopeName: string;
  minimumAgeMinutes: number | undefined;
}

function describeAge(minutes: number): string {
  if (minutes % 60 === 0) return minutes === 60 ? '1 hour' : `${minutes / 60} hours`;
  return `${minutes} ${plural(minutes, 'minute')}`;
}

function ageRule(minutes: number | undefined): string {
  if (minutes === 0) return 'This server offers objects of any age (PARAXIA_ORPHAN_MIN_AGE_MINUTES is 0), so check that no upload is in progress';
  return `Objects younger than ${minutes === undefined ? 'the minimum age' : describeAge(minutes)} are never offered`;
}

/** Objects no frame or certificate points at (mount one per scope, keyed by it): found on request, removed after a confirmation. */
export function OrphansSection({ organisationId, scopeName, minimumAgeMinutes }: OrphansSectionProps) {
  const find = useFindOrphanObjects();
  const remove = useRemoveOrphanObjects();
  const [list, setList] = useState<OrphanList | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [done, setDone] = useState<OrphanRemovalResult | null>(null);

  const onFind = () => {
    setDone(null);
    remove.reset();
    find.mutate({ organisationId }, { onSuccess: setList });
  };

  const listedBytes = list ? list.orphans.reduce((sum, orphan) => sum + orphan.sizeBytes, 0) : 0;

  const onConfirm = () => {
    if (!list) return;
    remove.mutate(
      list.orphans.map((orphan) => orphan.key),
      {
        onSuccess: (result) => {
          setDone(result);
          setList(null);
          setConfirming(false);
        },
        onError: () => setConfirming(false),
      },
    );
  };

  return (
    <Section
      title="Objects without a record"
      description="Files in object storage that no frame or certificate points at, for example left by an upload that broke off."
      actions={
        <Button variant="secondary" onClick={onFind} isBusy={find.isPending}>
          Look for objects without a record
        </Button>
      }
    >
      <p className="rounded-sheet border border-dashed border-rule-strong bg-sheet/70 px-4 py-2 text-small text-ink-soft">
        {ageRule(minimumAgeMinutes)}: an upload stores its files before its record, so a recent object may belong to an upload still in progress. Each key is checked again when you remove it, and one that
        has gained a record meanwhile is kept.
      </p>
      {find.error ? <ProblemNote title="The search failed" message={find.error.message} /> : null}
      {list ? (
        <div className="space-y-3" data-testid="orphan-list">
          <div className="flex flex-wrap items-center justify-between gap-3 rounded-sheet border border-rule-strong bg-shade/60 px-4 py-3">
            <p className="text-body">
              {list.orphanCount === 0 ? (
                <>
                  No objects without a record among <Count value={list.scannedObjectCount} /> {plural(list.scannedObjectCount, 'object')}
                  {organisationId ? <> of {scopeName}</> : null}.
                </>
              ) : (
                <>
                  <Count value={list.orphanCount} /> {plural(list.orphanCount, 'object')} without a record, <ByteSize bytes={list.orphanBytes} className="font-semibold" />, among{' '}
                  <Count value={list.scannedObjectCount} /> scanned
                  {list.orphans.length < list.orphanCount ? <> (the first <Count value={list.orphans.length} /> are listed)</> : null}.
                </>
              )}
              {list.youngSkippedCount > 0 ? (
                <span className="text-ink-faint">
                  {' '}
                  <Count value={list.youngSkippedCount} /> more {list.youngSkippedCount === 1 ? 'is' : 'are'} too recent to offer.
                </span>
              ) : null}
            </p>
            <Button variant="primary" onClick={() => setConfirming(true)} disabled={list.orphans.length === 0}>
              Remove listed objects…
            </Button>
          </div>
          {list.orphans.length > 0 ? (
            <DataTable
              caption="Objects without a record"
              columns={[
                { key: 'key', header: 'Key', cell: (row) => <span className="break-all font-mono text-caption">{row.key}</span> },
                { key: 'size', header: 'Size', numeric: true, widthClass: 'w-28', cell: (row) => <ByteSize bytes={row.sizeBytes} /> },
                {
                  key: 'modified',
                  header: 'Last modified (UTC)',
                  numeric: true,
                  widthClass: 'w-44',
                  cell: (row) => (row.lastModified ? `${row.lastModified.slice(0, 10)} ${row.lastModified.slice(11, 16)}` : '—'),
                },
              ]}
              rows={list.orphans}
              rowKey={(row) => row.key}
            />
          ) : null}
        </div>
      ) : null}
      {remove.error ? <ProblemNote title="Nothing was removed" message={remove.error.message} /> : null}
      {done ? (
        <div role="status" className="rounded-sheet border border-rule-strong bg-sheet px-4 py-3 text-body">
          Removed <Count value={done.removedCount} /> {plural(done.removedCount, 'object')}, freeing <ByteSize bytes={done.removedBytes} className="font-semibold" />.
          {done.kept.length > 0 ? (
            <ul className="mt-2 space-y-0.5 text-small text-ink-soft">
              {done.kept.map((item) => (
                <li key={item.key}>
                  Kept <span className="break-all font-mono text-caption">{item.key}</span>: it {KEPT_WORDS[item.reason]}.
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      <ConfirmDialog
        open={confirming && list !== null}
        title="Remove objects without a record?"
        confirmLabel={list ? `Remove ${list.orphans.length} ${plural(list.orphans.length, 'object')}` : 'Remove'}
        isBusy={remove.isPending}
        onConfirm={onConfirm}
        onCancel={() => setConfirming(false)}
      >
        {list ? (
          <>
            <p>
              This deletes the <strong className="numerals">{list.orphans.length}</strong> listed {plural(list.orphans.length, 'object')} (<ByteSize bytes={listedBytes} className="font-semibold" />) from
              object storage. It cannot be undone.
            </p>
            <p className="text-small text-ink-faint">No frame or certificate points at them now; any that gains a record before the removal runs is kept.</p>
          </>
        ) : null}
      </ConfirmDialog>
    </Section>
  );
}
