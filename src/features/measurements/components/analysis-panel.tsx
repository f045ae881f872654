import { useEffect, useRef } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { isAnalysisRunInProgress } from '@shared/schemas/analyses';
import type { MeasurementDetail } from '@shared/schemas/measurements';
import { Button } from '@/components/ui/button';
import { ProblemNote } from '@/components/ui/problem-note';
import { useAnalysisProgress } from '@/features/measurements/api/get-analysis-run';
import { measurementQueryKey } from '@/features/measurements/api/get-measurement';
import { useStartAnalysis } from '@/features/measurements/api/start-analysis';
import { AnalysisProgress } from '@/features/measurements/components/analysis-progress';
import { analysisReadiness } from '@/features/measurements/utils/analysis-readiness';

export interface AnalysisPanelProps {
  measurement: MeasurementDetail;
  uploadsInFlight: number;
  /** Called when a run finishes, with its version, so the page can show it. */
  onRunFinished?: (version: number) => void;
}

/**
 * Starts an analysis (or a re-run, which adds a version), says why it cannot
 * start yet, follows a run frame by frame while it works, and shows the
 * engine's sentence when it fails.
 */
export function AnalysisPanel({ measurement, uploadsInFlight, onRunFinished }: AnalysisPanelProps) {
  const queryClient = useQueryClient();
  const latest = measurement.analyses[0] ?? null;
  const watching = latest !== null && isAnalysisRunInProgress(latest.status) ? latest.version : null;
  const progress = useAnalysisProgress(measurement.id, watching);
  const run = progress.data && progress.data.version === watching ? progress.data : latest;
  const start = useStartAnalysis(measurement.id);

  const finishedVersion = useRef<number | null>(null);
  useEffect(() => {
    if (progress.data && !isAnalysisRunInProgress(progress.data.status) && finishedVersion.current !== progress.data.version) {
      finishedVersion.current = progress.data.version;
      void queryClient.invalidateQueries({ queryKey: measurementQueryKey(measurement.id) });
      onRunFinished?.(progress.data.version);
    }
  }, [progress.data, measurement.id, queryClient, onRunFinished]);

  const readiness = analysisReadiness({
    status: measurement.status,
    sweeps: measurement.sweeps,
    latestRunStatus: run?.status ?? null,
    uploadsInFlight,
  });
  const isRerun = measurement.analyses.length > 0;
  const nextVersion = (latest?.version ?? 0) + 1;

  return (
    <div className="space-y-3" data-role="analysis-panel">
      <div className="flex flex-wrap items-center gap-3">
        <Button onClick={() => start.mutate()} disabled={!readiness.ready} isBusy={start.isPending} data-role="analyse-button">
          {run && isAnalysisRunInProgress(run.status) ? `Analysis v${run.version} under way` : isRerun ? `Re-run analysis (v${nextVersion})` : 'Analyse'}
        </Button>
        <p className="text-small text-ink-soft" data-role="analyse-reason">
          {readiness.ready
            ? `${readiness.framesTotal} frames with readings in ${measurement.sweeps.length} ${measurement.sweeps.length === 1 ? 'sweep' : 'sweeps'} go into analysis v${nextVersion}, with the exclusions and equipment values as they are now. Earlier versions stay readable.`
            : readiness.reason}
        </p>
      </div>
      {start.error ? <ProblemNote title="The analysis did not start" message={start.error.message} /> : null}
      {progress.error && watching !== null ? (
        <ProblemNote
          title="Progress could not be read"
          message={`${progress.error.message} The analysis goes on; this page asks again in a moment.`}
        />
      ) : null}
      {run && isAnalysisRunInProgress(run.status) ? <AnalysisProgress run={run} /> : null}
      {run && run.status === 'failed' ? (
        <ProblemNote
          title={`Analysis v${run.version} failed`}
          message={run.errorMessage ?? 'The engine stopped without saying why. Try again; if it fails again, tell your administrator.'}
        />
      ) : null}
    </div>
  );
}
