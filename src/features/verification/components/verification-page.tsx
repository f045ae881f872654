import { useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { ParaxiaWordmark } from '@/components/layouts/paraxia-wordmark';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { SafetyNote } from '@/components/ui/safety-note';
import { useVerification } from '@/features/verification/api/get-verification';
import { CertificateFileCheck } from '@/features/verification/components/certificate-file-check';
import { VerificationResult } from '@/features/verification/components/verification-result';

/** Upper case, spaces and hyphens dropped, regrouped in fours: the form printed on a certificate. */
export function tidyCode(typed: string): string {
  const characters = typed.toUpperCase().replace(/[\s-]+/g, '');
  return (characters.match(/.{1,4}/g) ?? []).join('-');
}

/** The public page behind a certificate's QR code: type a code, see whether it is genuine and current, check the PDF. */
export function VerificationPage({ code }: { code: string | null }) {
  const navigate = useNavigate();
  const [typed, setTyped] = useState(code ?? '');
  const shownCode = code ? tidyCode(code) : null;
  const lookup = useVerification(shownCode);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const tidy = tidyCode(typed);
    if (tidy) navigate(`/verify/${tidy}`);
  };

  return (
    <div className="min-h-dvh bg-paper">
      <header className="border-b border-rule bg-sheet/70">
        <div className="mx-auto flex max-w-3xl items-center justify-between px-5 py-3">
          <Link to="/verify" aria-label="Paraxia certificate verification">
            <ParaxiaWordmark />
          </Link>
          <span className="text-caption uppercase tracking-wider text-ink-faint">Certificate verification</span>
        </div>
      </header>
      <main className="mx-auto max-w-3xl space-y-6 px-5 py-8">
        <div>
          <h1 className="text-title-lg">Verify a certificate</h1>
          <p className="mt-2 max-w-measure text-body text-ink-soft">
            Every certificate issued through Paraxia carries a verification code beside its QR code. Enter it to see whether
            the certificate is genuine, whether it is the current revision, and what it states.
          </p>
        </div>
        <form onSubmit={submit} className="flex flex-wrap items-end gap-3" aria-label="Look up a verification code">
          <label className="flex flex-col gap-1.5 text-small font-medium text-ink">
            Verification code
            <input
              value={typed}
              onChange={(event) => setTyped(event.target.value)}
              placeholder="e.g. 7KQ4-MX2R-9TWH"
              autoComplete="off"
              spellCheck={false}
              className="h-11 w-72 rounded-sheet border border-rule-strong bg-sheet px-3 font-mono text-lead uppercase tracking-wider text-ink placeholder:normal-case placeholder:tracking-normal placeholder:text-ink-faint/70"
            />
          </label>
          <Button type="submit" className="h-11">
            Verify
          </Button>
        </form>

        {shownCode === null ? null : lookup.isPending ? (
          <LoadingNote what="the certificate" />
        ) : lookup.isError ? (
          <ProblemNote title="The code could not be checked" message={lookup.error.message} />
        ) : (
          <>
            <VerificationResult answer={lookup.data} code={shownCode} />
            {lookup.data.found ? <CertificateFileCheck code={shownCode} /> : null}
          </>
        )}

        <SafetyNote context="certificate" />
        <p className="text-caption text-ink-faint">
          This page confirms what the laboratory issued; it shows nothing else of the laboratory’s or its client’s records.
          Conformity decisions and accreditation claims remain the issuing laboratory’s.
        </p>
      </main>
    </div>
  );
}
