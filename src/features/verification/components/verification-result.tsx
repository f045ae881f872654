import type { ReactNode } from 'react';
import { ConformityMark } from '@/components/ui/conformity-mark';
import { CircleTickGlyph, DiamondQuestionGlyph, SquareCrossGlyph } from '@/components/ui/mark-glyphs';
import { Quantity } from '@/components/ui/quantity';
import type { VerifiedCertificate } from '@shared/schemas/verification';
import type { VerificationAnswer } from '@/features/verification/api/get-verification';

const METHOD_WORDS: Record<VerifiedCertificate['method'], string> = {
  'finite-conjugate': 'Finite conjugate',
  'multi-conjugate': 'Multiple conjugates',
  displacement: 'Displacement (Bessel)',
  collimator: 'Collimator',
  'auxiliary-lens': 'Auxiliary lens',
};

function Verdict({ answer, code }: { answer: VerificationAnswer; code: string }) {
  if (!answer.found) {
    return (
      <div className="flex items-start gap-3" data-verdict="not-found">
        <SquareCrossGlyph className="mt-1 size-6 shrink-0 text-ink" />
        <div>
          <p className="font-serif text-title text-ink">No certificate with this code</p>
          <p className="mt-1 text-body text-ink-soft">
            Paraxia has no certificate with the code <span className="font-mono">{code}</span>. Check it against the code printed
            beside the QR code; if it still does not match, the document did not come from this laboratory’s system.
          </p>
        </div>
      </div>
    );
  }
  if (answer.status === 'superseded') {
    return (
      <div className="flex items-start gap-3" data-verdict="superseded">
        <DiamondQuestionGlyph className="mt-1 size-6 shrink-0 text-ink" />
        <div>
          <p className="font-serif text-title text-ink">Genuine, but superseded</p>
          <p className="mt-1 text-body text-ink-soft">
            Revision <span className="numerals">{answer.revision}</span> of certificate <span className="font-mono">{answer.number}</span> was issued,
            and was replaced{answer.supersededOn ? <> on <span className="numerals">{answer.supersededOn}</span></> : null} by revision{' '}
            <span className="numerals font-semibold text-ink">{answer.currentRevision}</span>. Ask the holder for the current revision.
          </p>
        </div>
      </div>
    );
  }
  return (
    <div className="flex items-start gap-3" data-verdict="current">
      <CircleTickGlyph className="mt-1 size-6 shrink-0 text-ink" />
      <div>
        <p className="font-serif text-title text-ink">Genuine and current</p>
        <p className="mt-1 text-body text-ink-soft">
          Certificate <span className="font-mono">{answer.number}</span> revision <span className="numerals">{answer.revision}</span> was issued by{' '}
          {answer.labName} and has not been replaced.
        </p>
      </div>
    </div>
  );
}

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="border-t border-rule py-2 sm:grid sm:grid-cols-[11rem_1fr] sm:gap-4">
      <dt className="text-small text-ink-faint">{label}</dt>
      <dd className="text-body text-ink">{children}</dd>
    </div>
  );
}

/** The answer for one code: a verdict in words and shape, then what the certificate states. */
export function VerificationResult({ answer, code }: { answer: VerificationAnswer; code: string }) {
  return (
    <section aria-label="Verification result" className="space-y-4 rounded-sheet border border-rule-strong bg-sheet px-5 py-4 shadow-sheet">
      <Verdict answer={answer} code={code} />
      {answer.found ? (
        <dl>
          <Fact label="Certificate">
            <span className="font-mono">{answer.number}</span> · revision <span className="numerals">{answer.revision}</span>
          </Fact>
          <Fact label="Date of issue">
            <span className="numerals">{answer.issueDate}</span>
          </Fact>
          <Fact label="Issued by">{answer.labName}</Fact>
          <Fact label="Item">
            <span className="font-mono">{answer.item.identifier}</span> — {answer.item.description}
          </Fact>
          <Fact label="Method">{METHOD_WORDS[answer.method]}</Fact>
          <Fact label="Focal length">
            <span className="flex flex-wrap items-baseline gap-x-3">
              <Quantity value={answer.results.focalLengthMm} uncertainty={answer.results.expandedUncertaintyMm} unit="mm" size="lead" />
              <span className="numerals text-small text-ink-faint">k = {answer.results.coverageFactor.toFixed(2)}</span>
            </span>
          </Fact>
          <Fact label="Conformity statement">
            <ConformityMark decision={answer.results.decision} />
          </Fact>
        </dl>
      ) : null}
    </section>
  );
}
