import { useId } from 'react';
import type { AnalysisRunSummary } from '@shared/schemas/analyses';
import { formatFixed } from '@/components/charts/chart-format';

export interface AnalysisVersionPickerProps {
  analyses: readonly AnalysisRunSummary[];
  /** The version shown now. */
  shownVersion: number;
  /** The measurement's current result (latest succeeded run); null before any succeeded. */
  currentVersion: number | null;
  onChange: (version: number) => void;
}

const RUN_STATUS_WORDS: Record<AnalysisRunSummary['status'], string> = {
  queued: 'queued',
  running: 'running',
  succeeded: 'succeeded',
  failed: 'failed',
};

function optionText(run: AnalysisRunSummary, total: number, currentVersion: number | null): string {
  const result =
    run.focalLengthMm !== null && run.expandedUncertaintyMm !== null
      ? ` · f′ = ${formatFixed(run.focalLengthMm, 3)} ± ${formatFixed(run.expandedUncertaintyMm, 3)} mm`
      : ` · ${RUN_STATUS_WORDS[run.status]}`;
  const currentWords = run.version === currentVersion ? ' — current' : '';
  return `analysis v${run.version} of ${total}${currentWords}${result}`;
}

/** Which analysis run is shown; every run is kept, and an older one is labelled as not current. */
export function AnalysisVersionPicker({ analyses, shownVersion, currentVersion, onChange }: AnalysisVersionPickerProps) {
  const id = useId();
  const total = analyses.reduce((max, run) => Math.max(max, run.version), 0);
  const isCurrent = shownVersion === currentVersion;
  const shownFailed = analyses.find((run) => run.version === shownVersion)?.status === 'failed';
  return (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-2" data-role="analysis-version-picker">
      <label htmlFor={id} className="text-small font-medium text-ink">
        Shown
      </label>
      <select
        id={id}
        value={shownVersion}
        onChange={(event) => onChange(Number(event.target.value))}
        className="numerals h-9 rounded-sheet border border-rule-strong bg-sheet px-2 text-small text-ink"
      >
        {analyses.map((run) => (
          <option key={run.version} value={run.version}>
            {optionText(run, total, currentVersion)}
          </option>
        ))}
      </select>
      <span
        className={`rounded-hair border px-2 py-0.5 text-small font-medium ${isCurrent ? 'border-rule-strong bg-sheet text-ink' : 'border-undecided/40 bg-undecided-tint text-undecided'}`}
        data-current={isCurrent || undefined}
      >
        {isCurrent ? 'the current result' : shownFailed ? 'a failed run, kept for the record' : 'an older run, not the current result'}
      </span>
    </div>
  );
}
