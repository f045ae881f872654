import type { PortalCertificateRevision } from '@shared/schemas/portal';

function issuedOn(iso: string): string {
  return iso.slice(0, 10);
}

/** The current revision as the one to download; earlier revisions listed underneath, marked superseded. */
export function CertificateDownloads({ revisions }: { revisions: PortalCertificateRevision[] }) {
  const current = revisions.find((revision) => revision.status === 'current');
  const superseded = revisions.filter((revision) => revision.status === 'superseded');
  if (!current && superseded.length === 0) return <span className="text-small text-ink-faint">No certificate yet</span>;
  return (
    <div className="space-y-1">
      {current ? (
        <a
          href={current.downloadUrl}
          download
          // The column is narrow at laptop widths; the visible label is short and the accessible name says it in full.
          aria-label={`Certificate ${current.number} rev. ${current.revision} (PDF)`}
          title={`Download certificate ${current.number}, revision ${current.revision}, as PDF`}
          className="inline-flex items-center gap-1.5 whitespace-nowrap rounded-sheet border border-ink bg-sheet px-2.5 py-1 text-small font-medium text-ink shadow-sheet hover:bg-shade"
          data-certificate-revision={current.revision}
        >
          <svg viewBox="0 0 16 16" aria-hidden="true" className="size-3.5 shrink-0">
            <path d="M8 2v8M4.5 6.8 8 10.3l3.5-3.5M3 13h10" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" />
          </svg>
          <span className="numerals">{current.number}</span>
          <span>
            rev. <span className="numerals">{current.revision}</span>
          </span>
          <span aria-hidden="true" className="text-ink-faint">
            ·
          </span>
          <span>PDF</span>
        </a>
      ) : null}
      {superseded.length > 0 ? (
        <ul className="space-y-0.5 text-caption text-ink-faint">
          {superseded.map((revision) => (
            <li key={revision.id}>
              <a href={revision.downloadUrl} download className="underline decoration-rule-strong underline-offset-2 hover:text-ink">
                rev. <span className="numerals">{revision.revision}</span>
              </a>{' '}
              of <span className="numerals">{issuedOn(revision.issuedAt)}</span> · <span className="line-through decoration-ink-faint/60">superseded</span>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
