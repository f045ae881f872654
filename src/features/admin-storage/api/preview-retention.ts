import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { RetentionPreview } from '@shared/schemas/storage';

/** A preview is asked for on purpose (a button), so it is a mutation-like request, not a cached query. */
export function previewRetention(request: { olderThanDays: number; organisationId: string | null }): Promise<RetentionPreview> {
  const query = new URLSearchParams({ olderThanDays: String(request.olderThanDays) });
  if (request.organisationId) query.set('organisationId', request.organisationId);
  return api.get<RetentionPreview>(`/api/storage/retention/preview?${query}`);
}

export function usePreviewRetention() {
  return useMutation({ mutationFn: previewRetention });
}
