import { useState } from 'react';
import type { MeasurementResult, SweepResult } from '@shared/schemas/measurement-result';
import { FocusCurvePlot } from '@/components/charts/focus-curve-plot';
import { Mtf50ThroughFocusPlot, framesWithMtf50 } from '@/components/charts/mtf50-through-focus-plot';
import { SizeThroughFocusPlot } from '@/components/charts/size-through-focus-plot';
import { formatFixed } from '@/components/charts/chart-format';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { Section } from '@/components/ui/section';
import { FrameStrip } from '@/features/measurement-result/components/frame-strip';
import { RejectedFramesList } from '@/features/measurement-result/components/rejected-frames-list';
import { ResultHeadline } from '@/features/measurement-result/components/result-headline';
import { UncertaintyBudgetTable } from '@/features/measurement-result/components/uncertainty-budget-table';
import { WarningsList } from '@/features/measurement-result/components/warnings-list';

export interface MeasurementResultViewProps {
  result: MeasurementResult;
  analysisVersion: number;
  /** Full-frame size of the sweep images (overlays are in full-frame pixels). */
  frameWidthPx: number;
  frameHeightPx: number;
  /** Thumbnail size ÷ full-frame size. */
  thumbnailScale: number;
  thumbnailUrl: (file: string) => string;
  frameUrl: (file: string) => string;
  /** The camera's pixel pitch from the equipment register; read back from the result when absent. */
  pixelPitchUm?: number;
}

/** Pixel pitch implied by a sweep's image size in mm and in px (both at best focus). */
export function pixelPitchFromSweep(sweep: SweepResult): number | undefined {
  const sizePx = sweep.sizeFits?.[0]?.sizeAtBestFocusPx;
  if (sweep.imageSizeMm && sizePx && sizePx > 0) return (sweep.imageSizeMm / sizePx) * 1000;
  return undefined;
}

function sweepDescription(sweep: SweepResult): string {
  const parts: string[] = [];
  if (sweep.moving) parts.push(sweep.moving === 'sensor' ? 'sensor moved through focus' : 'lens moved, object and sensor fixed');
  if (sweep.objectPositionMm !== undefined) parts.push(`object at ${formatFixed(sweep.objectPositionMm, 2)} mm`);
  if (sweep.lensPositionMm !== undefined) parts.push(`lens mark at ${formatFixed(sweep.lensPositionMm, 2)} mm`);
  if (sweep.sensorPositionMm !== undefined) parts.push(`sensor at ${formatFixed(sweep.sensorPositionMm, 2)} mm`);
  if (sweep.magnification !== null && sweep.magnification !== undefined) parts.push(`|m| = ${sweep.magnification.toFixed(5)}`);
  if (sweep.magnifications) parts.push(`|m| = ${sweep.magnifications.map((m) => m.toFixed(4)).join(' and ')}`);
  return parts.join(' · ');
}

/**
 * Everything an analysis produced, for the measurement page: the result,
 * each sweep's focus curve, frames and size through focus, the uncertainty
 * budget, warnings and rejected frames. Data arrive as props; nothing is fetched.
 */
export function MeasurementResultView({
  result,
  analysisVersion,
  frameWidthPx,
  frameHeightPx,
  thumbnailScale,
  thumbnailUrl,
  frameUrl,
  pixelPitchUm,
}: MeasurementResultViewProps) {
  const [highlightedFile, setHighlightedFile] = useState<string | null>(null);
  return (
    <div className="space-y-8" data-role="measurement-result">
      <RegionErrorBoundary region="Result">
        <ResultHeadline result={result} analysisVersion={analysisVersion} />
      </RegionErrorBoundary>

      {result.sweeps.map((sweep, index) => {
        const sweepLabel = `sweep ${index + 1}`;
        const pitchUm = pixelPitchUm ?? pixelPitchFromSweep(sweep);
        const sizeFitCount = sweep.sizeFits?.length ?? 0;
        const hasMtf = framesWithMtf50(sweep).length > 0;
        const sidePlots = sizeFitCount + (hasMtf ? 1 : 0);
        return (
          <Section key={index} title={result.sweeps.length > 1 ? `Sweep ${index + 1}` : 'Through focus'} description={sweepDescription(sweep)}>
            <RegionErrorBoundary region={`Focus curve of ${sweepLabel}`}>
              <FocusCurvePlot sweep={sweep} sweepLabel={sweepLabel} coverageFactor={result.coverageFactor} selectedFile={highlightedFile} />
            </RegionErrorBoundary>
            <RegionErrorBoundary region={`Frames of ${sweepLabel}`}>
              <FrameStrip
                sweep={sweep}
                sweepLabel={sweepLabel}
                frameWidthPx={frameWidthPx}
                frameHeightPx={frameHeightPx}
                thumbnailScale={thumbnailScale}
                thumbnailUrl={thumbnailUrl}
                frameUrl={frameUrl}
                highlightedFile={highlightedFile}
                onHighlightFile={setHighlightedFile}
              />
            </RegionErrorBoundary>
            {sidePlots > 0 ? (
              <div className={`grid gap-4 ${sidePlots > 1 ? 'xl:grid-cols-2' : ''}`}>
                {Array.from({ length: sizeFitCount }, (_, peakIndex) => (
                  <RegionErrorBoundary key={peakIndex} region={`Target size through focus of ${sweepLabel}`}>
                    <SizeThroughFocusPlot sweep={sweep} sweepLabel={sweepLabel} peakIndex={peakIndex} pixelPitchUm={pitchUm} />
                  </RegionErrorBoundary>
                ))}
                {hasMtf ? (
                  <RegionErrorBoundary region={`MTF50 of ${sweepLabel}`}>
                    <Mtf50ThroughFocusPlot sweep={sweep} sweepLabel={sweepLabel} pixelPitchUm={pitchUm} />
                  </RegionErrorBoundary>
                ) : null}
              </div>
            ) : null}
          </Section>
        );
      })}

      <Section title="Uncertainty" description="Which input limits the result, and a Monte Carlo check of the GUM interval.">
        <RegionErrorBoundary region="Uncertainty budget">
          <UncertaintyBudgetTable result={result} />
          {result.estimates && result.estimates.length > 0 ? (
            <div className="mt-3 text-small text-ink-soft" data-role="estimates">
              <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">Estimates combined into f′</p>
              <ul className="mt-1 space-y-0.5">
                {result.estimates.map((estimate) => (
                  <li key={estimate.name}>
                    {estimate.name}: <span className="numerals text-ink">{formatFixed(estimate.focalLengthMm, 4)}</span>{' '}
                    <span className="font-light text-ink-faint">mm</span>, u ={' '}
                    <span className="numerals">{formatFixed(estimate.standardUncertaintyMm, 4)}</span> <span className="font-light text-ink-faint">mm</span>
                  </li>
                ))}
              </ul>
            </div>
          ) : null}
        </RegionErrorBoundary>
      </Section>

      <div className="grid gap-8 xl:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <Section title="Warnings">
          <WarningsList warnings={result.warnings} />
        </Section>
        <Section title="Rejected frames" description="Frames left out of the fits, with the reason for each.">
          <RejectedFramesList sweeps={result.sweeps} captionHidden />
        </Section>
      </div>
    </div>
  );
}
