import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isApiError } from '@/lib/api-client';
import type { VerifiedCertificate } from '@shared/schemas/verification';

export type VerificationAnswer = VerifiedCertificate | { found: false; message: string };

/** The certificate a code belongs to; an unknown code is an answer ({ found: false }), not a failure. */
export async function getVerification(code: string, signal?: AbortSignal): Promise<VerificationAnswer> {
  try {
    return await api.get<VerifiedCertificate>(`/api/verification/${encodeURIComponent(code)}`, { signal });
  } catch (error) {
    if (isApiError(error) && error.status === 404) return { found: false, message: error.message };
    throw error;
  }
}

export function getVerificationQueryOptions(code: string) {
  return queryOptions({
    queryKey: ['verification', code],
    queryFn: ({ signal }) => getVerification(code, signal),
    retry: false,
    staleTime: 60_000,
  });
}

export function useVerification(code: string | null) {
  return useQuery({ ...getVerificationQueryOptions(code ?? ''), enabled: code !== null && code.trim() !== '' });
}
