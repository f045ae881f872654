import { useParams } from 'react-router-dom';
import { VerificationPage } from '@/features/verification/components/verification-page';

/** `/verify` and `/verify/:code`: public, outside the signed-in shell (a certificate's QR code points here). */
export function VerifyCertificateRoute() {
  const { code } = useParams();
  return (
    <>
      <title>{code ? `Verify ${code} · Paraxia` : 'Verify a certificate · Paraxia'}</title>
      <VerificationPage code={code ?? null} />
    </>
  );
}
