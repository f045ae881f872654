import { useState } from 'react';
import type { MeasurementDetail } from '@shared/schemas/measurements';
import { fourEyesRefusal } from '@shared/schemas/review';
import { REISSUE_REASON_MAX_LENGTH } from '@shared/schemas/certificates';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { ProblemNote } from '@/components/ui/problem-note';
import type { User } from '@/types/api';
import { useIssueCertificate, useReissueCertificate } from '../api/certificate-actions';

function issuedAt(iso: string): string {
  return new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

/** Issue (once approved), reissue with a reason, and every revision with its hash and a download link. */
export function CertificatesPanel({ measurement, user }: { measurement: MeasurementDetail; user: User }) {
  const issue = useIssueCertificate(measurement.id);
  const reissue = useReissueCertificate(measurement.id);
  const [reason, setReason] = useState('');
  const mayIssue = user.roles.some((role) => role === 'reviewer' || role === 'admin');
  const refusal = fourEyesRefusal(
    { number: measurement.number, performedById: measurement.performedBy?.id ?? null, submittedById: measurement.review.submittedBy?.id ?? null },
    user.id,
    measurement.status === 'certified' ? 'reissue a certificate for' : 'issue a certificate for',
  );
  const current = measurement.certificates.find((c) => c.status === 'current');

  return (
    <div className="space-y-3">
      {mayIssue && measurement.status === 'approved' ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button onClick={() => issue.mutate()} isBusy={issue.isPending} disabled={refusal !== null}>
            Issue certificate
          </Button>
          <span className="text-small text-ink-soft">{refusal ?? 'Renders the PDF, stores it with its SHA-256 and certifies the measurement.'}</span>
        </div>
      ) : null}
      {measurement.certificates.length === 0 ? (
        measurement.status === 'approved' ? null : <p className="text-small text-ink-faint">No certificate yet: one is issued after approval.</p>
      ) : (
        <DataTable
          caption="Certificate revisions"
          captionHidden
          rows={measurement.certificates}
          rowKey={(c) => c.id}
          isRowMuted={(c) => c.status === 'superseded'}
          columns={[
            { key: 'number', header: 'Number', cell: (c) => <span className="numerals">{c.number}</span> },
            { key: 'revision', header: 'Rev.', numeric: true, cell: (c) => c.revision },
            { key: 'status', header: 'Status', cell: (c) => (c.status === 'current' ? 'Current' : 'Superseded') },
            { key: 'issued', header: 'Issued', cell: (c) => `${c.issuedBy?.name ?? 'Former user'}, ${issuedAt(c.issuedAt)}` },
            { key: 'reason', header: 'Reason for revision', cell: (c) => c.reissueReason ?? '—' },
            { key: 'sha', header: 'SHA-256', cell: (c) => <span className="numerals" title={c.sha256}>{c.sha256.slice(0, 12)}…</span> },
            {
              key: 'download',
              header: 'PDF',
              cell: (c) => (
                <a href={c.downloadPath} download className="underline decoration-rule-strong underline-offset-4 hover:text-ink">
                  Download {c.number} rev {c.revision}
                </a>
              ),
            },
          ]}
        />
      )}
      {mayIssue && current && measurement.status === 'certified' ? (
        <form
          className="space-y-1.5 rounded-sheet border border-rule bg-sheet px-4 py-3"
          onSubmit={(event) => {
            event.preventDefault();
            reissue.mutate({ certificateId: current.id, reason }, { onSuccess: () => setReason('') });
          }}
        >
          <label htmlFor="reissue-reason" className="text-small font-medium text-ink">
            Reissue {current.number} as revision {current.revision + 1}: reason (printed on the new revision)
          </label>
          <textarea
            id="reissue-reason"
            rows={2}
            maxLength={REISSUE_REASON_MAX_LENGTH}
            value={reason}
            onChange={(event) => setReason(event.target.value)}
            className="w-full rounded-sheet border border-rule-strong bg-sheet px-3 py-2 text-body text-ink"
          />
          <div className="flex flex-wrap items-center gap-3">
            <Button type="submit" variant="secondary" size="sm" disabled={reason.trim().length < 5 || refusal !== null} isBusy={reissue.isPending}>
              Reissue with reason
            </Button>
            {refusal ? <span className="text-small text-ink-soft">{refusal}</span> : null}
          </div>
        </form>
      ) : null}
      {issue.error ?? reissue.error ? <ProblemNote title="The certificate was not issued" message={(issue.error ?? reissue.error)!.message} /> : null}
    </div>
  );
}
