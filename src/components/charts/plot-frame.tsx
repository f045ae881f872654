import type { ReactNode } from 'react';

export interface PlotFrameProps {
  /** Figure caption, e.g. "Focus curve, sweep 1". */
  title: string;
  xAxisLabel?: string;
  yAxisLabel?: string;
  /** Height of the plotting area; width follows the container. */
  heightClass?: string;
  /** Usually an <svg> drawn with d3-scale/d3-shape, filling the area. */
  children: ReactNode;
  /** Legend or notes under the plot. */
  footer?: ReactNode;
  /**
   * 'grid' (default) lays the millimetre-paper background behind the children;
   * 'plain' leaves the area bare for a plot that draws its own axes and a grid
   * aligned to its ticks (see MeasurementGrid).
   */
  surface?: 'grid' | 'plain';
}

/**
 * The frame every Paraxia plot sits in: a caption, a faint millimetre-paper
 * grid behind the drawing, and axis names. Scales and ticks belong to the plot.
 */
export function PlotFrame({
  title,
  xAxisLabel,
  yAxisLabel,
  heightClass = 'h-64',
  children,
  footer,
  surface = 'grid',
}: PlotFrameProps) {
  const areaClasses = surface === 'grid' ? 'plot-grid overflow-hidden rounded-hair border border-rule' : '';
  return (
    <figure className="rounded-sheet border border-rule bg-sheet p-3">
      <figcaption className="mb-2 font-serif text-title-sm font-semibold">{title}</figcaption>
      <div className="flex gap-2">
        {yAxisLabel ? (
          <div className="flex w-5 items-center justify-center">
            <span className="-rotate-90 whitespace-nowrap text-caption text-ink-faint">{yAxisLabel}</span>
          </div>
        ) : null}
        <div className={`relative min-w-0 flex-1 ${areaClasses} ${heightClass}`}>
          {children}
        </div>
      </div>
      {xAxisLabel ? <p className="mt-1 text-center text-caption text-ink-faint">{xAxisLabel}</p> : null}
      {footer ? <div className="mt-2 text-small text-ink-soft">{footer}</div> : null}
    </figure>
  );
}
