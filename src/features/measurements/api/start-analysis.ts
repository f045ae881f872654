import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnalysisRunSummary, StartAnalysisResponse } from '@shared/schemas/analyses';
import { api } from '@/lib/api-client';
import { measurementQueryKey } from '@/features/measurements/api/get-measurement';

export async function startAnalysis(measurementId: string): Promise<AnalysisRunSummary> {
  const answer = await api.post<StartAnalysisResponse>(`/api/measurements/${encodeURIComponent(measurementId)}/analyses`, {});
  return answer.analysis;
}

export function useStartAnalysis(measurementId: string, { onStarted }: { onStarted?: (run: AnalysisRunSummary) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => startAnalysis(measurementId),
    onSuccess: (run) => {
      void queryClient.invalidateQueries({ queryKey: measurementQueryKey(measurementId) });
      onStarted?.(run);
    },
  });
}
