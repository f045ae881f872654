import { storageObjectKinds, type StorageBreakdown, type StorageTally } from '@shared/schemas/storage';
import { STORAGE_KIND_SWATCH, STORAGE_KIND_WORDS } from '@/features/admin-storage/lib/storage-kind-words';
import { ByteSize, Count } from '@/features/admin-storage/components/byte-size';
import { plural } from '@/features/admin-storage/lib/plural';

export interface StorageTotalsProps {
  totals: StorageBreakdown;
  outsideOrganisations: StorageTally;
  scopeName: string;
  scannedAt: string;
}

/** The bucket at a glance: total bytes and objects, and one bar split by kind. */
export function StorageTotals({ totals, outsideOrganisations, scopeName, scannedAt }: StorageTotalsProps) {
  return (
    <div className="rounded-sheet border border-rule bg-sheet px-5 py-4">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">{scopeName}</p>
          <p className="mt-1 text-result font-medium" data-testid="storage-total-bytes">
            <ByteSize bytes={totals.bytes} />
          </p>
          <p className="text-small text-ink-soft">
            in <Count value={totals.objectCount} /> {plural(totals.objectCount, 'object')} · read from object storage at{' '}
            <span className="numerals">{new Date(scannedAt).toISOString().slice(11, 19)}</span> UTC
          </p>
        </div>
        {outsideOrganisations.objectCount > 0 ? (
          <p className="max-w-xs text-small text-ink-faint">
            <Count value={outsideOrganisations.objectCount} /> objects (<ByteSize bytes={outsideOrganisations.bytes} />) sit outside any
            organisation's folder; they count as "other".
          </p>
        ) : null}
      </div>
      <div className="mt-4 flex h-3 overflow-hidden rounded-sm border border-rule" aria-hidden="true">
        {storageObjectKinds.map((kind) =>
          totals.bytes > 0 && totals.byKind[kind].bytes > 0 ? (
            <span key={kind} className={STORAGE_KIND_SWATCH[kind]} style={{ width: `${(100 * totals.byKind[kind].bytes) / totals.bytes}%` }} />
          ) : null,
        )}
      </div>
      <dl className="mt-3 grid gap-x-10 gap-y-1.5 sm:grid-cols-2">
        {storageObjectKinds.map((kind) => (
          <div key={kind} className="flex items-baseline gap-2">
            <span aria-hidden="true" className={`size-2.5 shrink-0 translate-y-[0.05em] rounded-[2px] border border-rule-strong ${STORAGE_KIND_SWATCH[kind]}`} />
            <dt className="text-small text-ink-soft">{STORAGE_KIND_WORDS[kind]}</dt>
            <dd className="ml-auto text-right text-small">
              <ByteSize bytes={totals.byKind[kind].bytes} />
              <span className="ml-1.5 text-ink-faint">
                (<Count value={totals.byKind[kind].objectCount} />)
              </span>
            </dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
