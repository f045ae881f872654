import { useId } from 'react';
import { scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';
import type { FrameAnalysis, SweepResult } from '@shared/schemas/measurement-result';
import { AxisBreakMarks } from '@/components/charts/axis-break';
import { convertedAxisTicks, linearAxisTicks } from '@/components/charts/axis-ticks';
import { AxisTitleLine, ChartAxis } from '@/components/charts/chart-axis';
import { svgSafeId } from '@/components/charts/clip-id';
import { MeasurementGrid } from '@/components/charts/measurement-grid';
import { plotArea } from '@/components/charts/plot-area';
import { PlotFrame } from '@/components/charts/plot-frame';
import { LegendItem, LegendSwatch, PlotLegend, PointMark, diamondPath } from '@/components/charts/plot-marks';
import { frameTitle, positionToPx, rejectionsByFile, sweepPeaks, sweepPositionAxis } from '@/components/charts/sweep-plot-data';
import { useMeasuredWidth } from '@/components/charts/use-measured-width';

export interface Mtf50ThroughFocusPlotProps {
  sweep: SweepResult;
  sweepLabel: string;
  /** When given, a second axis shows MTF50 in line pairs per mm. */
  pixelPitchUm?: number;
  widthPx?: number;
}

const HEIGHT_PX = 270;

/** Frames that carry an MTF50 value (slanted-edge targets only). */
export function framesWithMtf50(sweep: SweepResult): FrameAnalysis[] {
  return (sweep.frames ?? [])
    .filter((f) => f.mtf50CyclesPerPixel !== null && Number.isFinite(f.mtf50CyclesPerPixel))
    .sort((a, b) => a.positionMm - b.positionMm);
}

/**
 * MTF50 through focus (ISO 12233 slanted edge), a second sharpness measure a
 * reviewer can set beside the focus curve. Renders nothing when no frame has
 * an MTF50 value (e.g. a dot-pair target).
 */
export function Mtf50ThroughFocusPlot({ sweep, sweepLabel, pixelPitchUm, widthPx }: Mtf50ThroughFocusPlotProps) {
  const { ref, widthPx: drawingWidthPx } = useMeasuredWidth<HTMLDivElement>({ fixedWidthPx: widthPx, fallbackWidthPx: 560 });
  const reactId = useId();
  const frames = framesWithMtf50(sweep);
  if (frames.length === 0) return null;
  const titleId = svgSafeId(reactId, 'title');
  const pixelPitchMm = pixelPitchUm && pixelPitchUm > 0 ? pixelPitchUm / 1000 : null;
  const area = plotArea({
    widthPx: drawingWidthPx,
    heightPx: HEIGHT_PX,
    marginsPx: { top: 24, right: pixelPitchMm ? 70 : 20, bottom: 48, left: 70 },
  });
  const segments = sweepPositionAxis({ sweep, leftPx: area.leftPx, rightPx: area.rightPx });
  const xPx = (positionMm: number) => positionToPx(segments, positionMm);
  const values = frames.map((f) => f.mtf50CyclesPerPixel as number);
  const yScale = scaleLinear()
    .domain([0, Math.max(...values) * 1.1])
    .nice(5)
    .range([area.bottomPx, area.topPx]);
  const yTicks = linearAxisTicks(yScale, 5);
  const lpTicks = pixelPitchMm ? convertedAxisTicks(yScale, (cyclesPerPixel) => cyclesPerPixel / pixelPitchMm, 5) : [];
  const rejections = rejectionsByFile(sweep);
  const peaks = sweepPeaks(sweep);
  const used = frames.filter((f) => f.status === 'used');
  const connect = line<FrameAnalysis>()
    .x((f) => xPx(f.positionMm))
    .y((f) => yScale(f.mtf50CyclesPerPixel as number));
  const paths = segments.map((segment) =>
    connect(used.filter((f) => f.positionMm >= segment.domainMm[0] && f.positionMm <= segment.domainMm[1])),
  );
  const best = used.reduce<FrameAnalysis | null>(
    (top, f) => (top === null || (f.mtf50CyclesPerPixel as number) > (top.mtf50CyclesPerPixel as number) ? f : top),
    null,
  );

  return (
    <PlotFrame
      title={`MTF50 through focus, ${sweepLabel}`}
      surface="plain"
      heightClass=""
      footer={
        <div className="space-y-2">
          {best ? (
            <p>
              Highest MTF50 <span className="numerals text-ink">{(best.mtf50CyclesPerPixel as number).toFixed(3)}</span>{' '}
              <span className="font-light text-ink-faint">cy/px</span>
              {pixelPitchMm ? (
                <>
                  {' '}= <span className="numerals text-ink">{((best.mtf50CyclesPerPixel as number) / pixelPitchMm).toFixed(1)}</span>{' '}
                  <span className="font-light text-ink-faint">lp/mm</span>
                </>
              ) : null}{' '}
              at <span className="numerals text-ink">{best.positionMm.toFixed(3)}</span> <span className="font-light text-ink-faint">mm</span>{' '}
              (slanted edge, ISO 12233).
            </p>
          ) : null}
          <PlotLegend>
            <LegendItem swatch={<LegendSwatch><path d="M1 8L9 3L17 7" fill="none" stroke="var(--color-ink-soft)" /><circle cx={9} cy={3} r={2.6} fill="var(--color-ink)" /></LegendSwatch>}>
              MTF50 of a used frame
            </LegendItem>
            <LegendItem swatch={<LegendSwatch widthPx={12}><path d={diamondPath(6, 6, 4.5)} fill="var(--color-sheet)" stroke="var(--color-ink-soft)" strokeWidth={1.3} /></LegendSwatch>}>
              rejected frame
            </LegendItem>
            <LegendItem swatch={<LegendSwatch><path d="M9 0V12" stroke="var(--color-focus)" strokeWidth={1.2} strokeDasharray="3 2" /></LegendSwatch>}>
              best focus from the focus curve
            </LegendItem>
          </PlotLegend>
        </div>
      }
    >
      <div ref={ref} className="w-full">
        <svg
          width={drawingWidthPx}
          height={HEIGHT_PX}
          viewBox={`0 0 ${drawingWidthPx} ${HEIGHT_PX}`}
          role="img"
          aria-labelledby={titleId}
          className="block max-w-full select-none"
          data-plot="mtf50-through-focus"
        >
          <title id={titleId}>{`MTF50 against rail position for ${sweepLabel}: ${frames.length} frames.`}</title>
          {segments.map((segment) => {
            const panel = { ...area, leftPx: segment.leftPx, rightPx: segment.rightPx, innerWidthPx: segment.rightPx - segment.leftPx };
            const xTicks = linearAxisTicks(segment.xScale, Math.max(2, Math.floor(panel.innerWidthPx / 90)));
            return (
              <g key={segment.leftPx}>
                <MeasurementGrid area={panel} xTickPositionsPx={xTicks.map((t) => t.positionPx)} yTickPositionsPx={yTicks.map((t) => t.positionPx)} />
                <ChartAxis orientation="bottom" area={panel} ticks={xTicks} />
              </g>
            );
          })}
          {peaks.map((peak) => (
            <line
              key={peak.symbol}
              x1={xPx(peak.bestFocusPositionMm)}
              x2={xPx(peak.bestFocusPositionMm)}
              y1={area.topPx}
              y2={area.bottomPx}
              stroke="var(--color-focus)"
              strokeWidth={1.2}
              strokeDasharray="4 3"
              data-role="best-focus-reference"
            />
          ))}
          {paths.map((d, index) => (d ? <path key={index} d={d} fill="none" stroke="var(--color-ink-soft)" strokeWidth={1.1} /> : null))}
          {frames.map((frame) => (
            <PointMark
              key={frame.file}
              x={xPx(frame.positionMm)}
              y={yScale(frame.mtf50CyclesPerPixel as number)}
              kind={frame.status === 'rejected' ? 'rejected' : 'used'}
              title={`${frameTitle(frame, rejections.get(frame.file))}; MTF50 ${(frame.mtf50CyclesPerPixel as number).toFixed(3)} cy/px`}
              dataAttributes={{ 'data-file': frame.file, 'data-position-mm': frame.positionMm }}
            />
          ))}
          <ChartAxis orientation="left" area={area} ticks={yTicks} title={{ quantity: 'MTF50', unit: 'cy/px' }} titleOffsetPx={54} />
          {pixelPitchMm ? <ChartAxis orientation="right" area={area} ticks={lpTicks} title={{ quantity: 'MTF50', unit: 'lp/mm' }} titleOffsetPx={54} /> : null}
          <AxisBreakMarks segments={segments} atPx={[area.bottomPx]} />
          <AxisTitleLine x={(area.leftPx + area.rightPx) / 2} y={area.bottomPx + 36} quantity="Rail position z" unit="mm" />
        </svg>
      </div>
    </PlotFrame>
  );
}
