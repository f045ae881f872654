import { EmptyState } from '@/components/ui/empty-state';
import { CertificateSheetIllustration } from '@/components/illustrations/certificate-sheet';

export interface ClientOrdersPanelProps {
  /** The client's organisation, as the lab knows it. */
  organisationName: string | null;
}

/** A client's work orders and certificates; empty until work orders exist. */
export function ClientOrdersPanel({ organisationName }: ClientOrdersPanelProps) {
  const who = organisationName ?? 'your organisation';
  return (
    <EmptyState
      illustration={<CertificateSheetIllustration />}
      title={`No orders from ${who} yet`}
      willShow={[
        'Each work order with its lenses, due date and where it stands',
        'A results summary per lens: focal length, uncertainty and conformity',
        'Certificates to download as PDF, each with a code anyone can verify',
      ]}
    >
      <p>
        When the lab accepts a work order from {who}, it appears here and you can follow it from the bench to the
        certificate. Only people of {who} see these records.
      </p>
    </EmptyState>
  );
}
