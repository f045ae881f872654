import { useId } from 'react';
import { line } from 'd3-shape';
import type { SweepResult } from '@shared/schemas/measurement-result';
import { AxisBreakMarks } from '@/components/charts/axis-break';
import { AxisTitleLine, ChartAxis } from '@/components/charts/chart-axis';
import { linearAxisTicks } from '@/components/charts/axis-ticks';
import { focusCurveLayout } from '@/components/charts/focus-curve-layout';
import { MeasurementGrid } from '@/components/charts/measurement-grid';
import { PlotFrame } from '@/components/charts/plot-frame';
import { LegendItem, LegendSwatch, PlotLegend, PointMark, diamondPath } from '@/components/charts/plot-marks';
import { frameTitle, rejectionsByFile } from '@/components/charts/sweep-plot-data';
import { useMeasuredWidth } from '@/components/charts/use-measured-width';
import { digitsForUncertainty } from '@/lib/format-quantity';

export interface FocusCurvePlotProps {
  sweep: SweepResult;
  /** e.g. "sweep 1". */
  sweepLabel: string;
  /** k for the best-focus band ± k·u. */
  coverageFactor: number;
  /** A frame to ring in the signal colour (e.g. the thumbnail under the pointer). */
  selectedFile?: string | null;
  /** Fixed drawing width; by default the plot follows its container. */
  widthPx?: number;
}

const MODEL_WORDS: Record<string, string> = { gaussian: 'Gaussian', lorentzian: 'Lorentzian' };

/**
 * A sweep's focus measure against rail position: frames in the fit, frames
 * outside it, rejected frames (hollow diamonds, reason in the tooltip), the
 * fitted model, and each best focus with its ± U band in the signal colour.
 * Below, on the same x scale, the residuals of the fit.
 */
export function FocusCurvePlot({ sweep, sweepLabel, coverageFactor, selectedFile = null, widthPx }: FocusCurvePlotProps) {
  const { ref, widthPx: drawingWidthPx } = useMeasuredWidth<HTMLDivElement>({ fixedWidthPx: widthPx, fallbackWidthPx: 760 });
  const titleId = useId();
  const layout = focusCurveLayout({ sweep, widthPx: drawingWidthPx, coverageFactor });
  const { mainArea, residualArea, yScale, residualScale, peaks, panels, xPx } = layout;
  const panelTicks = panels.map((panel) => linearAxisTicks(panel.segment.xScale, Math.max(2, Math.floor(panel.mainArea.innerWidthPx / 90))));
  const yTicks = linearAxisTicks(yScale, 5);
  // Ticks at the strip's very edges would crowd the curve's axis labels just above.
  const residualLimit = Math.max(...residualScale.domain().map(Math.abs));
  const residualTicks = linearAxisTicks(residualScale, 3).filter((_, index, all) => all.length <= 3 || Math.abs(residualScale.invert(all[index].positionPx)) < residualLimit * 0.99);
  const rejections = rejectionsByFile(sweep);
  const toPath = line<{ positionMm: number; value: number }>()
    .x((d) => xPx(d.positionMm))
    .y((d) => yScale(d.value));
  const selected = layout.plottedFrames.find((f) => f.file === selectedFile);
  const peakWords = peaks
    .map((p) => `${p.symbol} = ${p.bestFocusPositionMm.toFixed(3)} mm ± ${p.expandedUncertaintyMm.toFixed(3)} mm`)
    .join(', ');
  const modelName = peaks.find((p) => p.modelName)?.modelName ?? null;

  return (
    <PlotFrame
      title={`Focus curve, ${sweepLabel}`}
      surface="plain"
      heightClass=""
      footer={
        <div className="space-y-2">
          <PeakSummary peaks={peaks} coverageFactor={coverageFactor} modelName={modelName} />
          <PlotLegend>
            <LegendItem swatch={<LegendSwatch widthPx={10}><circle cx={5} cy={6} r={3.2} fill="var(--color-ink)" /></LegendSwatch>}>
              frame in the fit
            </LegendItem>
            <LegendItem swatch={<LegendSwatch widthPx={10}><circle cx={5} cy={6} r={2.6} fill="var(--color-ink-faint)" /></LegendSwatch>}>
              frame outside the fit window
            </LegendItem>
            <LegendItem
              swatch={<LegendSwatch widthPx={12}><path d={diamondPath(6, 6, 4.5)} fill="var(--color-sheet)" stroke="var(--color-ink-soft)" strokeWidth={1.3} /></LegendSwatch>}
            >
              rejected frame (point at it for the reason)
            </LegendItem>
            <LegendItem swatch={<LegendSwatch><path d="M1 6H17" stroke="var(--color-ink)" strokeWidth={1.6} /></LegendSwatch>}>
              fitted {modelName ? (MODEL_WORDS[modelName] ?? modelName) : ''} model
            </LegendItem>
            <LegendItem
              swatch={
                <LegendSwatch>
                  <rect x={4} y={0} width={10} height={12} className="fill-focus-tint" />
                  <path d="M9 0V12" stroke="var(--color-focus)" strokeWidth={1.6} />
                </LegendSwatch>
              }
            >
              best focus ± U (k = {coverageFactor.toFixed(2)})
            </LegendItem>
          </PlotLegend>
          {layout.unplottedFrames.length > 0 ? (
            <p className="text-caption text-ink-faint">
              Not drawn (no focus value): {layout.unplottedFrames.map((f) => frameTitle(f, rejections.get(f.file))).join('; ')}.
            </p>
          ) : null}
        </div>
      }
    >
      <div ref={ref} className="w-full">
        <svg
          width={layout.widthPx}
          height={layout.heightPx}
          viewBox={`0 0 ${layout.widthPx} ${layout.heightPx}`}
          role="img"
          aria-labelledby={titleId}
          className="block max-w-full select-none"
          data-plot="focus-curve"
        >
          <title id={titleId}>
            {`Focus measure against rail position for ${sweepLabel}: ${layout.plottedFrames.length} frames drawn; best focus ${peakWords} (k = ${coverageFactor}).`}
          </title>
          {panels.map((panel, index) => (
            <g key={`grid-${panel.segment.leftPx}`}>
              <MeasurementGrid
                area={panel.mainArea}
                xTickPositionsPx={panelTicks[index].map((t) => t.positionPx)}
                yTickPositionsPx={yTicks.map((t) => t.positionPx)}
              />
              <MeasurementGrid
                area={panel.residualArea}
                xTickPositionsPx={panelTicks[index].map((t) => t.positionPx)}
                yTickPositionsPx={residualTicks.map((t) => t.positionPx)}
              />
            </g>
          ))}

          {peaks.map((peak) => (
            <g key={`band-${peak.symbol}`} data-role="best-focus-band" data-position-mm={peak.bestFocusPositionMm}>
              {[layout.mainArea, layout.residualArea].map((area) => (
                <rect
                  key={area.topPx}
                  x={Math.min(peak.bandLeftPx, peak.xPx - 1)}
                  width={Math.max(peak.bandRightPx - peak.bandLeftPx, 2)}
                  y={area.topPx}
                  height={area.innerHeightPx}
                  className="fill-focus-tint"
                  opacity={0.85}
                />
              ))}
            </g>
          ))}

          {panels.map((panel) => (
            <line
              key={`zero-${panel.segment.leftPx}`}
              x1={panel.residualArea.leftPx}
              x2={panel.residualArea.rightPx}
              y1={residualScale(0)}
              y2={residualScale(0)}
              stroke="var(--color-ink-soft)"
              strokeWidth={1}
              data-role="residual-zero-line"
              shapeRendering="crispEdges"
            />
          ))}
          <text x={residualArea.leftPx + 6} y={residualArea.topPx + 13} fontSize={11} fill="var(--color-ink-faint)">
            Residual, data − model
            <tspan fontWeight={300}> / rel.</tspan>
          </text>

          {peaks.map((peak) =>
            peak.curve.length > 1 ? (
              <path
                key={`curve-${peak.symbol}`}
                d={toPath([...peak.curve].sort((a, b) => a.positionMm - b.positionMm)) ?? undefined}
                fill="none"
                stroke="var(--color-ink)"
                strokeWidth={1.6}
                data-role="fitted-curve"
              />
            ) : null,
          )}

          {peaks.map((peak) => (
            <g key={`marker-${peak.symbol}`} data-role="best-focus-marker" data-position-mm={peak.bestFocusPositionMm} data-x-px={peak.xPx}>
              <line x1={peak.xPx} x2={peak.xPx} y1={mainArea.topPx} y2={mainArea.bottomPx} stroke="var(--color-focus)" strokeWidth={1.5} />
              <line
                x1={peak.xPx}
                x2={peak.xPx}
                y1={residualArea.topPx}
                y2={residualArea.bottomPx}
                stroke="var(--color-focus)"
                strokeWidth={1}
                strokeDasharray="3 3"
              />
              {peak.peakValue !== null ? (
                <path
                  d={`M${peak.xPx - 6} ${yScale(peak.peakValue) - 12}L${peak.xPx} ${yScale(peak.peakValue) - 3}L${peak.xPx + 6} ${yScale(peak.peakValue) - 12}Z`}
                  fill="var(--color-focus)"
                  data-role="fitted-peak"
                />
              ) : null}
              <text
                x={clamp(peak.xPx, mainArea.leftPx + 70, mainArea.rightPx - 70)}
                y={mainArea.topPx - 10}
                textAnchor="middle"
                fontSize={12}
                fill="var(--color-focus)"
                style={{ fontFamily: 'var(--font-mono)' }}
              >
                {`${peak.symbol} = ${peak.bestFocusPositionMm.toFixed(digitsForUncertainty(peak.expandedUncertaintyMm))}`}
                <tspan fontWeight={300} style={{ fontFamily: 'var(--font-sans)' }}>
                  {' mm'}
                </tspan>
              </text>
            </g>
          ))}

          {layout.plottedFrames.map((frame) => {
            const kind = frame.status === 'rejected' ? 'rejected' : frame.focusResidual !== null ? 'used' : 'context';
            return (
              <PointMark
                key={frame.file}
                x={xPx(frame.positionMm)}
                y={yScale(frame.focusValue as number)}
                kind={kind}
                title={frameTitle(frame, rejections.get(frame.file))}
                dataAttributes={{ 'data-file': frame.file, 'data-position-mm': frame.positionMm }}
              />
            );
          })}

          {layout.plottedFrames
            .filter((f) => f.focusResidual !== null && Number.isFinite(f.focusResidual))
            .map((frame) => {
              const x = xPx(frame.positionMm);
              const y = residualScale(frame.focusResidual as number);
              return (
                <g key={`r-${frame.file}`} data-role="residual" data-file={frame.file}>
                  <line x1={x} x2={x} y1={residualScale(0)} y2={y} stroke="var(--color-ink-soft)" strokeWidth={1} />
                  <circle cx={x} cy={y} r={2.4} fill="var(--color-ink)">
                    <title>{`${frame.file}: residual ${(frame.focusResidual as number).toFixed(4)}`}</title>
                  </circle>
                </g>
              );
            })}

          {selected ? (
            <circle
              cx={xPx(selected.positionMm)}
              cy={yScale(selected.focusValue as number)}
              r={7.5}
              fill="none"
              stroke="var(--color-focus)"
              strokeWidth={2}
              data-role="selected-frame"
              data-file={selected.file}
            />
          ) : null}

          <ChartAxis orientation="left" area={mainArea} ticks={yTicks} title={{ quantity: 'Focus measure', unit: 'rel.' }} titleOffsetPx={50} />
          <ChartAxis orientation="left" area={residualArea} ticks={residualTicks} name="residual" />
          {panels.map((panel, index) => (
            <g key={`axes-${panel.segment.leftPx}`}>
              <ChartAxis orientation="bottom" area={panel.mainArea} ticks={panelTicks[index]} hideTickLabels name="x-main" />
              <ChartAxis orientation="bottom" area={panel.residualArea} ticks={panelTicks[index]} name="x" />
            </g>
          ))}
          <AxisBreakMarks segments={panels.map((p) => p.segment)} atPx={[mainArea.bottomPx, residualArea.bottomPx]} />
          <AxisTitleLine x={(mainArea.leftPx + mainArea.rightPx) / 2} y={residualArea.bottomPx + 36} quantity="Rail position z" unit="mm" />
        </svg>
      </div>
    </PlotFrame>
  );
}

function clamp(value: number, low: number, high: number): number {
  return Math.min(Math.max(value, low), high);
}

function PeakSummary({
  peaks,
  coverageFactor,
  modelName,
}: {
  peaks: ReturnType<typeof focusCurveLayout>['peaks'];
  coverageFactor: number;
  modelName: string | null;
}) {
  if (peaks.length === 0) return <p className="text-small text-ink-faint">No best focus was fitted in this sweep.</p>;
  return (
    <p className="text-small text-ink-soft">
      {peaks.map((peak, index) => {
        const digits = digitsForUncertainty(peak.expandedUncertaintyMm);
        return (
          <span key={peak.symbol}>
            {index > 0 ? '; ' : ''}
            Best focus <span className="numerals text-focus">{peak.symbol}</span> ={' '}
            <span className="numerals text-ink">{peak.bestFocusPositionMm.toFixed(digits)}</span>{' '}
            <span className="numerals">± {peak.expandedUncertaintyMm.toFixed(digits)}</span> <span className="font-light text-ink-faint">mm</span>
          </span>
        );
      })}{' '}
      (U = k·u with k = {coverageFactor.toFixed(2)}; u from the {modelName ? (MODEL_WORDS[modelName] ?? modelName) : 'peak'} fit).
    </p>
  );
}
