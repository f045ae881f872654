import type { PlotArea } from '@/components/charts/plot-area';

export interface MeasurementGridProps {
  area: PlotArea;
  /** Pixel positions of the x-axis ticks: the major vertical lines. */
  xTickPositionsPx: number[];
  /** Pixel positions of the y-axis ticks: the major horizontal lines. */
  yTickPositionsPx: number[];
}

/** Minor lines between major ones, fewer when the ticks are close together. */
function minorLines(majorPx: number[], fromPx: number, toPx: number): { minor: number[]; major: number[] } {
  const major = [...majorPx].sort((a, b) => a - b).filter((p) => p >= fromPx - 0.5 && p <= toPx + 0.5);
  if (major.length < 2) return { minor: [], major };
  const spacingPx = major[1] - major[0];
  const divisions = spacingPx >= 60 ? 5 : spacingPx >= 24 ? 2 : 1;
  const stepPx = spacingPx / divisions;
  const minor: number[] = [];
  if (divisions > 1) {
    for (let p = major[0] - stepPx; p >= fromPx; p -= stepPx) minor.push(p);
    for (let p = major[0] + stepPx; p <= toPx; p += stepPx) {
      if (!major.some((m) => Math.abs(m - p) < stepPx / 4)) minor.push(p);
    }
  }
  return { minor, major };
}

/**
 * The faint millimetre-paper grid of a plot area, drawn in SVG so that its
 * major lines fall exactly on the axis ticks.
 */
export function MeasurementGrid({ area, xTickPositionsPx, yTickPositionsPx }: MeasurementGridProps) {
  const x = minorLines(xTickPositionsPx, area.leftPx, area.rightPx);
  const y = minorLines(yTickPositionsPx, area.topPx, area.bottomPx);
  return (
    <g data-role="measurement-grid" aria-hidden="true" shapeRendering="crispEdges">
      <rect x={area.leftPx} y={area.topPx} width={area.innerWidthPx} height={area.innerHeightPx} fill="var(--color-sheet)" />
      {x.minor.map((p) => (
        <line key={`xm${p}`} x1={p} x2={p} y1={area.topPx} y2={area.bottomPx} stroke="var(--color-grid)" />
      ))}
      {y.minor.map((p) => (
        <line key={`ym${p}`} y1={p} y2={p} x1={area.leftPx} x2={area.rightPx} stroke="var(--color-grid)" />
      ))}
      {x.major.map((p) => (
        <line key={`xM${p}`} x1={p} x2={p} y1={area.topPx} y2={area.bottomPx} stroke="var(--color-grid-major)" />
      ))}
      {y.major.map((p) => (
        <line key={`yM${p}`} y1={p} y2={p} x1={area.leftPx} x2={area.rightPx} stroke="var(--color-grid-major)" />
      ))}
      <rect
        x={area.leftPx}
        y={area.topPx}
        width={area.innerWidthPx}
        height={area.innerHeightPx}
        fill="none"
        stroke="var(--color-rule)"
      />
    </g>
  );
}
