import type { AnalysisPhase, AnalysisRunSummary } from '@shared/schemas/analyses';

export const ANALYSIS_PHASE_WORDS: Record<AnalysisPhase, string> = {
  waiting: 'Waiting for an analysis worker',
  measuring: 'Measuring frames: focus and target size',
  fitting: 'Fitting focus curves and the uncertainty budget',
  succeeded: 'Finished',
  failed: 'Stopped',
};

/** A running analysis: its phase in words and a bar of frames measured, "frames 12 of 25". */
export function AnalysisProgress({ run }: { run: Pick<AnalysisRunSummary, 'version' | 'phase' | 'framesDone' | 'framesTotal' | 'status'> }) {
  const fraction = run.framesTotal > 0 ? Math.min(1, run.framesDone / run.framesTotal) : 0;
  const percent = Math.floor(fraction * 100);
  return (
    <div className="space-y-1.5 rounded-sheet border border-rule bg-sheet px-4 py-3" data-role="analysis-progress" data-phase={run.phase}>
      <div className="flex flex-wrap items-baseline justify-between gap-2 text-small">
        <p className="font-semibold text-ink">
          Analysis v{run.version} · <span className="font-normal text-ink-soft">{ANALYSIS_PHASE_WORDS[run.phase]}</span>
        </p>
        <p className="numerals text-ink" role="status" aria-live="polite">
          frames {run.framesDone} of {run.framesTotal}
        </p>
      </div>
      <div
        role="progressbar"
        aria-label={`Analysis v${run.version}: frames measured`}
        aria-valuemin={0}
        aria-valuemax={run.framesTotal}
        aria-valuenow={run.framesDone}
        aria-valuetext={`${run.framesDone} of ${run.framesTotal} frames`}
        className="relative h-2 overflow-hidden rounded-full bg-shade"
      >
        <span
          className={`absolute inset-y-0 left-0 rounded-full bg-ink transition-[width] duration-500 ${run.phase === 'waiting' ? 'animate-pulse opacity-40' : ''}`}
          style={{ width: run.phase === 'waiting' ? '100%' : `${percent}%` }}
        />
      </div>
      {run.phase === 'fitting' ? <p className="text-caption text-ink-faint">Every frame is measured; the fits take a few seconds more.</p> : null}
    </div>
  );
}
