import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CertificateResponse, CertificateSummary } from '@shared/schemas/certificates';
import { api } from '@/lib/api-client';

/** The measurement page's query key; features do not import each other. */
const measurementKey = (measurementId: string) => ['measurements', measurementId] as const;

export async function issueCertificate(measurementId: string): Promise<CertificateSummary> {
  return (await api.post<CertificateResponse>(`/api/measurements/${encodeURIComponent(measurementId)}/certificates`, {})).certificate;
}

export async function reissueCertificate(certificateId: string, reason: string): Promise<CertificateSummary> {
  return (await api.post<CertificateResponse>(`/api/certificates/${encodeURIComponent(certificateId)}/reissue`, { reason })).certificate;
}

export function useIssueCertificate(measurementId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => issueCertificate(measurementId),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: measurementKey(measurementId) });
      void queryClient.invalidateQueries({ queryKey: ['review-queue'] });
    },
  });
}

export function useReissueCertificate(measurementId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ certificateId, reason }: { certificateId: string; reason: string }) => reissueCertificate(certificateId, reason),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: measurementKey(measurementId) }),
  });
}
