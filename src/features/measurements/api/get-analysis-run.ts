import { queryOptions, useQuery } from '@tanstack/react-query';
import {
  ANALYSIS_PROGRESS_POLL_MS,
  isAnalysisRunInProgress,
  type AnalysisRun,
  type AnalysisRunProgressResponse,
  type AnalysisRunResponse,
  type AnalysisRunSummary,
} from '@shared/schemas/analyses';
import { api } from '@/lib/api-client';

function runPath(measurementId: string, version: number): string {
  return `/api/measurements/${encodeURIComponent(measurementId)}/analyses/${version}`;
}

export function analysisRunQueryKey(measurementId: string, version: number) {
  return ['measurements', measurementId, 'analyses', version] as const;
}

export async function getAnalysisRun(measurementId: string, version: number, signal?: AbortSignal): Promise<AnalysisRun> {
  const body = await api.get<AnalysisRunResponse>(runPath(measurementId, version), { signal });
  return body.analysis;
}

/** A run's full record, result included: finished runs never change, so it is kept as long as the page lives. */
export function getAnalysisRunQueryOptions(measurementId: string, version: number) {
  return queryOptions({
    queryKey: analysisRunQueryKey(measurementId, version),
    queryFn: ({ signal }) => getAnalysisRun(measurementId, version, signal),
    staleTime: Infinity,
  });
}

export function useAnalysisRun(measurementId: string, version: number | null) {
  return useQuery({ ...getAnalysisRunQueryOptions(measurementId, version ?? 0), enabled: version !== null });
}

export async function getAnalysisProgress(measurementId: string, version: number, signal?: AbortSignal): Promise<AnalysisRunSummary> {
  const body = await api.get<AnalysisRunProgressResponse>(`${runPath(measurementId, version)}?fields=progress`, { signal });
  return body.analysis;
}

/** Polls a run's progress every second while it is queued or running; stops by itself once it finishes. */
export function useAnalysisProgress(measurementId: string, version: number | null) {
  return useQuery({
    queryKey: [...analysisRunQueryKey(measurementId, version ?? 0), 'progress'] as const,
    queryFn: ({ signal }) => getAnalysisProgress(measurementId, version ?? 0, signal),
    enabled: version !== null,
    refetchInterval: (query) => {
      const run = query.state.data;
      return run === undefined || isAnalysisRunInProgress(run.status) ? ANALYSIS_PROGRESS_POLL_MS : false;
    },
    refetchIntervalInBackground: false,
    staleTime: 0,
  });
}
