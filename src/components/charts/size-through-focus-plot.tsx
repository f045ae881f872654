import { useId } from 'react';
import { scaleLinear } from 'd3-scale';
import type { SweepResult } from '@shared/schemas/measurement-result';
import { convertedAxisTicks, linearAxisTicks } from '@/components/charts/axis-ticks';
import { ChartAxis } from '@/components/charts/chart-axis';
import { svgSafeId } from '@/components/charts/clip-id';
import { MeasurementGrid } from '@/components/charts/measurement-grid';
import { plotArea, type PlotArea } from '@/components/charts/plot-area';
import { PlotFrame } from '@/components/charts/plot-frame';
import { LegendItem, LegendSwatch, PlotLegend, PointMark, diamondPath } from '@/components/charts/plot-marks';
import { frameTitle, rejectionsByFile, segmentFor, sweepPeaks, sweepPositionAxis } from '@/components/charts/sweep-plot-data';
import { useMeasuredWidth } from '@/components/charts/use-measured-width';
import { digitsForUncertainty } from '@/lib/format-quantity';

export interface SizeThroughFocusPlotProps {
  sweep: SweepResult;
  sweepLabel: string;
  /** Which fitted size line to show (displacement sweeps have one per sharp position). */
  peakIndex?: number;
  /** Camera pixel pitch; when given, a second axis shows the image size in mm. */
  pixelPitchUm?: number;
  widthPx?: number;
}

export interface SizeThroughFocusLayoutOptions {
  sweep: SweepResult;
  peakIndex: number;
  widthPx: number;
  pixelPitchUm?: number;
}

const HEIGHT_PX = 290;

export function checkSizeThroughFocusLayoutOptions(options: SizeThroughFocusLayoutOptions): SizeThroughFocusLayoutOptions {
  const fits = options.sweep?.sizeFits ?? [];
  if (!(Number.isInteger(options.peakIndex) && options.peakIndex >= 0 && options.peakIndex < fits.length)) {
    throw new RangeError(`sizeThroughFocusLayout: option "peakIndex" must index one of the sweep's ${fits.length} size fits; got ${options.peakIndex}.`);
  }
  if (options.pixelPitchUm !== undefined && !(options.pixelPitchUm > 0)) {
    throw new RangeError(`sizeThroughFocusLayout: option "pixelPitchUm" must be a positive number; got ${options.pixelPitchUm}.`);
  }
  if (!(options.widthPx >= 200)) throw new RangeError(`sizeThroughFocusLayout: option "widthPx" must be at least 200; got ${options.widthPx}.`);
  return options;
}

/** Scales of the size-through-focus plot for one fitted line: the x range is the stretch of rail around that peak. */
export function sizeThroughFocusLayout(options: SizeThroughFocusLayoutOptions) {
  const { sweep, peakIndex, widthPx, pixelPitchUm } = checkSizeThroughFocusLayoutOptions(options);
  const area: PlotArea = plotArea({
    widthPx,
    heightPx: HEIGHT_PX,
    marginsPx: { top: 24, right: pixelPitchUm ? 70 : 20, bottom: 48, left: 70 },
  });
  const fit = (sweep.sizeFits ?? [])[peakIndex];
  const peak = sweepPeaks(sweep)[peakIndex];
  const bestFocusPositionMm = peak?.bestFocusPositionMm ?? (fit.positionsMm[0] + fit.positionsMm[1]) / 2;
  const segments = sweepPositionAxis({ sweep, leftPx: area.leftPx, rightPx: area.rightPx });
  const own = segmentFor(segments, bestFocusPositionMm);
  const xScale = scaleLinear().domain(own.domainMm).range([area.leftPx, area.rightPx]);
  const frames = (sweep.frames ?? [])
    .filter((f) => f.sizePx !== null && Number.isFinite(f.sizePx))
    .filter((f) => f.positionMm >= own.domainMm[0] && f.positionMm <= own.domainMm[1])
    .sort((a, b) => a.positionMm - b.positionMm);
  const sizes = [...frames.map((f) => f.sizePx as number), fit.sizeAtBestFocusPx];
  const low = Math.min(...sizes);
  const high = Math.max(...sizes);
  const pad = 0.08 * (high - low || Math.max(1, high * 0.01));
  const yScale = scaleLinear()
    .domain([low - pad, high + pad])
    .nice(5)
    .range([area.bottomPx, area.topPx]);
  const lineAt = (positionMm: number) => fit.interceptPx + fit.slopePxPerMm * positionMm;
  return {
    area,
    xScale,
    yScale,
    fit,
    frames,
    bestFocusPositionMm,
    bestFocusSymbol: peak?.symbol ?? 'z₀',
    lineAt,
    heightPx: HEIGHT_PX,
    pixelPitchMm: pixelPitchUm ? pixelPitchUm / 1000 : null,
  };
}

/**
 * The target's image size against rail position with the fitted line, and
 * the size at best focus (where the line is read) in the signal colour; a
 * second axis in mm via the pixel pitch.
 */
export function SizeThroughFocusPlot({ sweep, sweepLabel, peakIndex = 0, pixelPitchUm, widthPx }: SizeThroughFocusPlotProps) {
  const { ref, widthPx: drawingWidthPx } = useMeasuredWidth<HTMLDivElement>({ fixedWidthPx: widthPx, fallbackWidthPx: 560 });
  const reactId = useId();
  const clipId = svgSafeId(reactId, 'clip');
  const titleId = svgSafeId(reactId, 'title');
  const layout = sizeThroughFocusLayout({ sweep, peakIndex, widthPx: drawingWidthPx, pixelPitchUm });
  const { area, xScale, yScale, fit, frames, bestFocusPositionMm, lineAt, pixelPitchMm } = layout;
  const xTicks = linearAxisTicks(xScale, Math.max(3, Math.floor(area.innerWidthPx / 90)));
  const yTicks = linearAxisTicks(yScale, 5);
  const mmTicks = pixelPitchMm ? convertedAxisTicks(yScale, (px) => px * pixelPitchMm, 5) : [];
  const rejections = rejectionsByFile(sweep);
  const [domainLow, domainHigh] = xScale.domain();
  const markerX = xScale(bestFocusPositionMm);
  const markerY = yScale(fit.sizeAtBestFocusPx);
  const inWindow = (p: number) => p >= fit.positionsMm[0] - 1e-9 && p <= fit.positionsMm[1] + 1e-9;
  const title = sweep.sizeFits && sweep.sizeFits.length > 1 ? `Target size through focus, ${sweepLabel}, near ${layout.bestFocusSymbol}` : `Target size through focus, ${sweepLabel}`;
  const sizeDigits = Math.min(4, Math.max(2, digitsForUncertainty(fit.sizeAtBestFocusStandardUncertaintyPx)));
  const sizeMmText = pixelPitchMm ? ` (${(fit.sizeAtBestFocusPx * pixelPitchMm).toFixed(4)} mm)` : '';

  return (
    <PlotFrame
      title={title}
      surface="plain"
      heightClass=""
      footer={
        <div className="space-y-2">
          <p>
            Size at best focus <span className="numerals text-focus">y′({layout.bestFocusSymbol})</span> ={' '}
            <span className="numerals text-ink">{fit.sizeAtBestFocusPx.toFixed(sizeDigits)}</span>{' '}
            <span className="numerals">± {fit.sizeAtBestFocusStandardUncertaintyPx.toFixed(sizeDigits)}</span>{' '}
            <span className="font-light text-ink-faint">px</span>
            {pixelPitchMm ? (
              <>
                {' '}= <span className="numerals text-ink">{(fit.sizeAtBestFocusPx * pixelPitchMm).toFixed(4)}</span>{' '}
                <span className="font-light text-ink-faint">mm</span>
              </>
            ) : null}{' '}
            (standard uncertainty); line slope <span className="numerals text-ink">{fit.slopePxPerMm.toFixed(3)}</span>{' '}
            <span className="font-light text-ink-faint">px/mm</span>, fitted over{' '}
            <span className="numerals">{fit.positionsMm[0].toFixed(2)}–{fit.positionsMm[1].toFixed(2)}</span>{' '}
            <span className="font-light text-ink-faint">mm</span> (ν = {fit.degreesOfFreedom}).
          </p>
          <PlotLegend>
            <LegendItem swatch={<LegendSwatch widthPx={10}><circle cx={5} cy={6} r={3.2} fill="var(--color-ink)" /></LegendSwatch>}>
              frame in the line fit
            </LegendItem>
            <LegendItem swatch={<LegendSwatch widthPx={10}><circle cx={5} cy={6} r={2.6} fill="var(--color-ink-faint)" /></LegendSwatch>}>
              other frame
            </LegendItem>
            <LegendItem swatch={<LegendSwatch widthPx={12}><path d={diamondPath(6, 6, 4.5)} fill="var(--color-sheet)" stroke="var(--color-ink-soft)" strokeWidth={1.3} /></LegendSwatch>}>
              rejected frame
            </LegendItem>
            <LegendItem swatch={<LegendSwatch><path d="M1 6H17" stroke="var(--color-ink)" strokeWidth={1.6} /></LegendSwatch>}>
              fitted line
            </LegendItem>
            <LegendItem swatch={<LegendSwatch widthPx={14}><circle cx={7} cy={6} r={4.5} fill="none" stroke="var(--color-focus)" strokeWidth={2} /></LegendSwatch>}>
              size at best focus
            </LegendItem>
          </PlotLegend>
        </div>
      }
    >
      <div ref={ref} className="w-full">
        <svg
          width={drawingWidthPx}
          height={layout.heightPx}
          viewBox={`0 0 ${drawingWidthPx} ${layout.heightPx}`}
          role="img"
          aria-labelledby={titleId}
          className="block max-w-full select-none"
          data-plot="size-through-focus"
        >
          <title id={titleId}>
            {`Target image size against rail position for ${sweepLabel}: ${fit.sizeAtBestFocusPx.toFixed(2)} px${sizeMmText} at best focus ${bestFocusPositionMm.toFixed(3)} mm.`}
          </title>
          <defs>
            <clipPath id={clipId}>
              <rect x={area.leftPx} y={area.topPx} width={area.innerWidthPx} height={area.innerHeightPx} />
            </clipPath>
          </defs>
          <MeasurementGrid area={area} xTickPositionsPx={xTicks.map((t) => t.positionPx)} yTickPositionsPx={yTicks.map((t) => t.positionPx)} />
          <g clipPath={`url(#${clipId})`}>
            <line
              x1={xScale(domainLow)}
              x2={xScale(domainHigh)}
              y1={yScale(lineAt(domainLow))}
              y2={yScale(lineAt(domainHigh))}
              stroke="var(--color-ink-faint)"
              strokeWidth={1}
              strokeDasharray="4 3"
            />
            <line
              x1={xScale(fit.positionsMm[0])}
              x2={xScale(fit.positionsMm[1])}
              y1={yScale(lineAt(fit.positionsMm[0]))}
              y2={yScale(lineAt(fit.positionsMm[1]))}
              stroke="var(--color-ink)"
              strokeWidth={1.6}
              data-role="fitted-line"
            />
            <line x1={area.leftPx} x2={markerX} y1={markerY} y2={markerY} stroke="var(--color-focus)" strokeWidth={1} strokeDasharray="3 3" />
            <line x1={markerX} x2={markerX} y1={markerY} y2={area.bottomPx} stroke="var(--color-focus)" strokeWidth={1} strokeDasharray="3 3" />
          </g>
          {frames.map((frame) => (
            <PointMark
              key={frame.file}
              x={xScale(frame.positionMm)}
              y={yScale(frame.sizePx as number)}
              kind={frame.status === 'rejected' ? 'rejected' : inWindow(frame.positionMm) ? 'used' : 'context'}
              title={`${frameTitle(frame, rejections.get(frame.file))}; size ${(frame.sizePx as number).toFixed(2)} px`}
              dataAttributes={{ 'data-file': frame.file, 'data-position-mm': frame.positionMm }}
            />
          ))}
          <circle
            cx={markerX}
            cy={markerY}
            r={6}
            fill="none"
            stroke="var(--color-focus)"
            strokeWidth={2}
            data-role="size-at-best-focus"
            data-x-px={markerX}
            data-y-px={markerY}
          />
          <text
            x={markerX + (markerX > area.leftPx + area.innerWidthPx * 0.6 ? -10 : 10)}
            y={markerY + (fit.slopePxPerMm >= 0 ? 20 : -12)}
            textAnchor={markerX > area.leftPx + area.innerWidthPx * 0.6 ? 'end' : 'start'}
            fontSize={12}
            fill="var(--color-focus)"
            style={{ fontFamily: 'var(--font-mono)' }}
          >
            {`y′(${layout.bestFocusSymbol}) = ${fit.sizeAtBestFocusPx.toFixed(1)}`}
            <tspan fontWeight={300} style={{ fontFamily: 'var(--font-sans)' }}>
              {' px'}
            </tspan>
          </text>
          <ChartAxis orientation="left" area={area} ticks={yTicks} title={{ quantity: 'Image size y′', unit: 'px' }} titleOffsetPx={54} />
          {pixelPitchMm ? (
            <ChartAxis orientation="right" area={area} ticks={mmTicks} title={{ quantity: 'y′', unit: 'mm' }} titleOffsetPx={56} />
          ) : null}
          <ChartAxis orientation="bottom" area={area} ticks={xTicks} title={{ quantity: 'Rail position z', unit: 'mm' }} />
        </svg>
      </div>
    </PlotFrame>
  );
}
