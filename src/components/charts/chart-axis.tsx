import type { AxisTick } from '@/components/charts/axis-ticks';
import type { PlotArea } from '@/components/charts/plot-area';

export interface AxisTitleText {
  /** The quantity, e.g. "Rail position z". */
  quantity: string;
  /** Printed after a solidus in a lighter weight, e.g. "mm" → "Rail position z / mm". */
  unit: string;
}

export interface ChartAxisProps {
  orientation: 'bottom' | 'left' | 'right';
  area: PlotArea;
  ticks: AxisTick[];
  title?: AxisTitleText;
  /** Draw tick marks only (an axis shared with a panel below). */
  hideTickLabels?: boolean;
  /** Where the axis line sits, for a bottom axis that is not the area's bottom edge. */
  atPx?: number;
  /** Distance from the axis line to the middle of the title. */
  titleOffsetPx?: number;
  /** Extra classes on the axis group, e.g. a data attribute hook in tests. */
  name?: string;
}

const TICK_LENGTH_PX = 5;
const TICK_FONT_PX = 11;
const TITLE_FONT_PX = 12;

/**
 * One axis: a hairline, outward ticks, tick labels in tabular figures, and a
 * title that always carries its unit as "quantity / unit" (ISO 80000-1 style).
 */
export function ChartAxis({ orientation, area, ticks, title, hideTickLabels = false, atPx, titleOffsetPx, name }: ChartAxisProps) {
  const visibleTicks = ticks.filter((tick) =>
    orientation === 'bottom'
      ? tick.positionPx >= area.leftPx - 0.5 && tick.positionPx <= area.rightPx + 0.5
      : tick.positionPx >= area.topPx - 0.5 && tick.positionPx <= area.bottomPx + 0.5,
  );
  if (orientation === 'bottom') {
    const y = atPx ?? area.bottomPx;
    const titleY = y + (titleOffsetPx ?? 34);
    return (
      <g data-axis={name ?? 'x'} className="text-ink-soft">
        <line x1={area.leftPx} x2={area.rightPx} y1={y} y2={y} stroke="var(--color-ink-soft)" shapeRendering="crispEdges" />
        {visibleTicks.map((tick) => (
          <g key={`${tick.positionPx}-${tick.label}`} transform={`translate(${tick.positionPx},${y})`}>
            <line y2={TICK_LENGTH_PX} stroke="var(--color-ink-soft)" shapeRendering="crispEdges" />
            {hideTickLabels ? null : (
              <text y={TICK_LENGTH_PX + 12} textAnchor="middle" fontSize={TICK_FONT_PX} style={tickStyle} fill="var(--color-ink-soft)">
                {tick.label}
              </text>
            )}
          </g>
        ))}
        {title ? (
          <AxisTitle title={title} x={(area.leftPx + area.rightPx) / 2} y={titleY} rotate={false} />
        ) : null}
      </g>
    );
  }
  const isLeft = orientation === 'left';
  const x = isLeft ? area.leftPx : area.rightPx;
  const direction = isLeft ? -1 : 1;
  const titleX = x + direction * (titleOffsetPx ?? 46);
  return (
    <g data-axis={name ?? (isLeft ? 'y' : 'y2')}>
      <line x1={x} x2={x} y1={area.topPx} y2={area.bottomPx} stroke="var(--color-ink-soft)" shapeRendering="crispEdges" />
      {visibleTicks.map((tick) => (
        <g key={`${tick.positionPx}-${tick.label}`} transform={`translate(${x},${tick.positionPx})`}>
          <line x2={direction * TICK_LENGTH_PX} stroke="var(--color-ink-soft)" shapeRendering="crispEdges" />
          {hideTickLabels ? null : (
            <text
              x={direction * (TICK_LENGTH_PX + 3)}
              dy="0.34em"
              textAnchor={isLeft ? 'end' : 'start'}
              fontSize={TICK_FONT_PX}
              style={tickStyle}
              fill="var(--color-ink-soft)"
            >
              {tick.label}
            </text>
          )}
        </g>
      ))}
      {title ? <AxisTitle title={title} x={titleX} y={(area.topPx + area.bottomPx) / 2} rotate /> : null}
    </g>
  );
}

const tickStyle = { fontFamily: 'var(--font-mono)', fontVariantNumeric: 'tabular-nums' } as const;

function AxisTitle({ title, x, y, rotate }: { title: AxisTitleText; x: number; y: number; rotate: boolean }) {
  return (
    <text
      x={rotate ? 0 : x}
      y={rotate ? 0 : y}
      transform={rotate ? `translate(${x},${y}) rotate(-90)` : undefined}
      textAnchor="middle"
      dy={rotate ? '0.34em' : undefined}
      fontSize={TITLE_FONT_PX}
      fill="var(--color-ink-soft)"
      style={{ fontFamily: 'var(--font-sans)' }}
      data-axis-title
    >
      {title.quantity}
      <tspan fill="var(--color-ink-faint)" fontWeight={300} data-unit>
        {' / '}
        {title.unit}
      </tspan>
    </text>
  );
}

/** An axis title on its own, e.g. one title under the two panels of a broken axis. */
export function AxisTitleLine({ x, y, quantity, unit, rotate = false }: AxisTitleText & { x: number; y: number; rotate?: boolean }) {
  return (
    <g data-axis="x-title">
      <AxisTitle title={{ quantity, unit }} x={x} y={y} rotate={rotate} />
    </g>
  );
}
