import type { FrameOverlay } from '@shared/schemas/measurement-result';
import type { PixelRect } from '@shared/measure/types';

export interface ScaledOverlay {
  pattern: FrameOverlay['pattern'];
  regionPx: PixelRect;
  pointsPx: { x: number; y: number }[];
  radiusPx: number | null;
}

/** An overlay in full-frame pixels, mapped to an image shown at `scale` × the frame's size. */
export function scaleOverlay(overlay: FrameOverlay, scale: number): ScaledOverlay {
  if (!(Number.isFinite(scale) && scale > 0)) throw new RangeError(`scaleOverlay: option "scale" must be a positive number; got ${scale}.`);
  return {
    pattern: overlay.pattern,
    regionPx: {
      x: overlay.regionPx.x * scale,
      y: overlay.regionPx.y * scale,
      width: overlay.regionPx.width * scale,
      height: overlay.regionPx.height * scale,
    },
    pointsPx: overlay.pointsPx.map((p) => ({ x: p.x * scale, y: p.y * scale })),
    radiusPx: overlay.radiusPx === undefined ? null : overlay.radiusPx * scale,
  };
}

export interface FrameOverlayDrawingProps {
  overlay: FrameOverlay;
  /** Displayed size ÷ full-frame size. */
  scale: number;
  /** Line width in screen pixels. */
  strokeWidthPx?: number;
  /** Smallest drawn marker radius in screen pixels, so a tiny dot stays visible. */
  minimumMarkerRadiusPx?: number;
  /** Keep strokes and markers the same on screen when an outer transform zooms the drawing. */
  nonScalingStroke?: boolean;
}

/**
 * The detected target drawn over a frame: the analysed region dashed, dot
 * centres as small crosshair circles, or the square's corners as a polygon.
 * Each line is drawn twice (light halo, dark ink) so it shows on a dark target
 * as well as on a light background.
 */
export function FrameOverlayDrawing({ overlay, scale, strokeWidthPx = 1.2, minimumMarkerRadiusPx = 3, nonScalingStroke = false }: FrameOverlayDrawingProps) {
  const scaled = scaleOverlay(overlay, scale);
  const vectorEffect = nonScalingStroke ? ('non-scaling-stroke' as const) : undefined;
  const layers = [
    { stroke: 'var(--color-sheet)', width: strokeWidthPx + 2, opacity: 0.85 },
    { stroke: 'var(--color-ink)', width: strokeWidthPx, opacity: 1 },
  ];
  const markerRadius = Math.max(minimumMarkerRadiusPx, scaled.radiusPx ?? 0);
  return (
    <g data-role="frame-overlay" data-pattern={overlay.pattern} fill="none">
      <rect
        x={scaled.regionPx.x}
        y={scaled.regionPx.y}
        width={scaled.regionPx.width}
        height={scaled.regionPx.height}
        stroke="var(--color-ink-soft)"
        strokeWidth={Math.max(0.75, strokeWidthPx * 0.75)}
        strokeDasharray="4 3"
        vectorEffect={vectorEffect}
        data-role="overlay-region"
      />
      {layers.map((layer) => (
        <g key={layer.stroke} stroke={layer.stroke} strokeWidth={layer.width} opacity={layer.opacity}>
          {scaled.pattern === 'square' && scaled.pointsPx.length >= 3 ? (
            <polygon points={scaled.pointsPx.map((p) => `${p.x},${p.y}`).join(' ')} vectorEffect={vectorEffect} data-role="overlay-square" />
          ) : (
            scaled.pointsPx.map((p, i) => (
              <g key={i} data-role="overlay-dot">
                <circle cx={p.x} cy={p.y} r={markerRadius} vectorEffect={vectorEffect} />
                <path
                  d={`M${p.x - markerRadius * 1.6} ${p.y}H${p.x + markerRadius * 1.6}M${p.x} ${p.y - markerRadius * 1.6}V${p.y + markerRadius * 1.6}`}
                  vectorEffect={vectorEffect}
                />
              </g>
            ))
          )}
        </g>
      ))}
    </g>
  );
}
