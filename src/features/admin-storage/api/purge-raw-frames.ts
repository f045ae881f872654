import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { RetentionPreview, RetentionPurgeResult } from '@shared/schemas/storage';
import { storageQueryKey } from '@/features/admin-storage/api/get-storage-usage';

/** Confirms exactly the previewed set: the server refuses (409) if it has changed since. */
export function purgeRawFrames(preview: RetentionPreview): Promise<RetentionPurgeResult> {
  return api.post<RetentionPurgeResult>('/api/storage/retention/purge', {
    olderThanDays: preview.olderThanDays,
    organisationId: preview.organisationId,
    expectedFrameCount: preview.frameCount,
    expectedBytes: preview.bytes,
    previewToken: preview.previewToken,
  });
}

export function usePurgeRawFrames() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: purgeRawFrames,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: storageQueryKey }),
  });
}
