import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateLensBody, LensSummary } from '@shared/schemas/lenses';

export async function createLens(workOrderId: string, request: CreateLensBody): Promise<LensSummary> {
  const body = await api.post<{ lens: LensSummary }>(`/api/work-orders/${encodeURIComponent(workOrderId)}/lenses`, request);
  return body.lens;
}

/** The page that shows the work order refreshes it in `onCreated`; this feature does not know its cache keys. */
export function useCreateLens(workOrderId: string, { onCreated }: { onCreated?: (lens: LensSummary) => void | Promise<void> } = {}) {
  return useMutation({
    mutationFn: (request: CreateLensBody) => createLens(workOrderId, request),
    onSuccess: (lens) => onCreated?.(lens),
  });
}
