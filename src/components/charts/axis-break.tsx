import type { PositionSegment } from '@/components/charts/sweep-plot-data';

/** Two short slanted strokes at each side of a break in a broken x axis. */
export function AxisBreakMarks({ segments, atPx }: { segments: PositionSegment[]; atPx: number[] }) {
  if (segments.length < 2) return null;
  const edges = segments.slice(0, -1).flatMap((s, i) => [s.rightPx, segments[i + 1].leftPx]);
  return (
    <g data-role="axis-break" aria-hidden="true">
      {atPx.flatMap((y) =>
        edges.map((x) => (
          <path key={`${x}-${y}`} d={`M${x - 4} ${y + 5}L${x + 2} ${y - 5}M${x - 1} ${y + 5}L${x + 5} ${y - 5}`} stroke="var(--color-ink-soft)" strokeWidth={1.1} />
        )),
      )}
    </g>
  );
}
