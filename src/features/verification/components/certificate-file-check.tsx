import { useDropzone } from 'react-dropzone';
import { CircleTickGlyph, SquareCrossGlyph } from '@/components/ui/mark-glyphs';
import { ProblemNote } from '@/components/ui/problem-note';
import { useCheckCertificateFile } from '@/features/verification/api/check-certificate-file';

/** Drop the PDF in hand: its SHA-256 is compared with the one kept when this revision was issued. */
export function CertificateFileCheck({ code }: { code: string }) {
  const check = useCheckCertificateFile();
  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    onDrop: (accepted, rejected) => {
      const file = accepted[0] ?? rejected[0]?.file;
      if (file) check.mutate({ code, file });
    },
    multiple: false,
    disabled: check.isPending,
  });
  const result = check.data;
  return (
    <section aria-label="Check a PDF file" className="space-y-3">
      <h2 className="text-title-sm">Check the PDF you received</h2>
      <div
        {...getRootProps({ 'aria-label': 'Drop the certificate PDF here, or press to choose it' })}
        className={`flex cursor-pointer flex-col items-center gap-1 rounded-sheet border-2 border-dashed px-4 py-6 text-center ${
          isDragActive ? 'border-ink bg-shade' : 'border-rule-strong bg-sheet hover:bg-shade/40'
        }`}
        data-role="certificate-drop-zone"
      >
        <input {...getInputProps()} data-role="certificate-file-input" />
        <p className="text-body font-medium text-ink">{check.isPending ? 'Checking…' : isDragActive ? 'Release to check' : 'Drop the certificate PDF here, or click to choose it'}</p>
        <p className="text-caption text-ink-faint">The file is compared by its SHA-256 fingerprint and not kept · up to 10 MB</p>
      </div>
      {check.isError ? <ProblemNote title="The file could not be checked" message={check.error.message} /> : null}
      {result ? (
        result.matches ? (
          <p role="status" className="flex items-start gap-2 rounded-sheet border border-rule-strong bg-sheet px-4 py-3 text-body text-ink" data-file-check="match">
            <CircleTickGlyph className="mt-1 size-4 shrink-0" />
            <span>
              This file is exactly the PDF issued as certificate <span className="font-mono">{result.number}</span> revision{' '}
              <span className="numerals">{result.revision}</span>. Nothing in it has been changed.
              <span className="mt-1 block break-all font-mono text-caption text-ink-faint">SHA-256 {result.uploadedSha256}</span>
            </span>
          </p>
        ) : (
          <p role="alert" className="flex items-start gap-2 rounded-sheet border border-nonconform/50 bg-nonconform-tint/60 px-4 py-3 text-body text-ink" data-file-check="mismatch">
            <SquareCrossGlyph className="mt-1 size-4 shrink-0 text-nonconform" />
            <span>
              <strong>Not genuine for this code.</strong> This file differs from the PDF issued as certificate{' '}
              <span className="font-mono">{result.number}</span> revision <span className="numerals">{result.revision}</span>: it has been altered,
              or it is a different document. Do not rely on it.
              <span className="mt-1 block break-all font-mono text-caption text-ink-faint">SHA-256 of your file {result.uploadedSha256}</span>
            </span>
          </p>
        )
      ) : null}
    </section>
  );
}
