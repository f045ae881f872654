import type { ReactNode } from 'react';

/*
 * Point marks shared by the plots. Shape carries meaning, so a plot printed
 * in grey still reads: a filled disc is a frame in use, a hollow diamond a
 * rejected frame; conformity marks follow ConformityMark's glyphs
 * (circle + tick, square + cross, diamond + question mark).
 */

export type PointMarkKind = 'used' | 'context' | 'rejected';

export function diamondPath(x: number, y: number, halfSizePx: number): string {
  return `M${x} ${y - halfSizePx}L${x + halfSizePx} ${y}L${x} ${y + halfSizePx}L${x - halfSizePx} ${y}Z`;
}

export interface PointMarkProps {
  x: number;
  y: number;
  kind: PointMarkKind;
  /** Native tooltip text: the frame, its position and, for a rejected frame, the reason. */
  title?: string;
  dataAttributes?: Record<string, string | number>;
}

export function PointMark({ x, y, kind, title, dataAttributes }: PointMarkProps) {
  const titleNode = title ? <title>{title}</title> : null;
  if (kind === 'rejected') {
    return (
      <path
        d={diamondPath(x, y, 4.5)}
        fill="var(--color-sheet)"
        stroke="var(--color-ink-soft)"
        strokeWidth={1.3}
        data-mark="rejected"
        {...dataAttributes}
      >
        {titleNode}
      </path>
    );
  }
  return (
    <circle
      cx={x}
      cy={y}
      r={kind === 'used' ? 3.2 : 2.6}
      fill={kind === 'used' ? 'var(--color-ink)' : 'var(--color-ink-faint)'}
      data-mark={kind}
      {...dataAttributes}
    >
      {titleNode}
    </circle>
  );
}

/** A small inline drawing for a legend entry, on the text baseline. */
export function LegendSwatch({ children, widthPx = 18 }: { children: ReactNode; widthPx?: number }) {
  return (
    <svg width={widthPx} height={12} viewBox={`0 0 ${widthPx} 12`} aria-hidden="true" focusable="false" className="inline-block shrink-0 align-[-1px]">
      {children}
    </svg>
  );
}

export function LegendItem({ swatch, children }: { swatch: ReactNode; children: ReactNode }) {
  return (
    <li className="inline-flex items-center gap-1.5">
      {swatch}
      <span>{children}</span>
    </li>
  );
}

export function PlotLegend({ children }: { children: ReactNode }) {
  return <ul className="flex flex-wrap gap-x-5 gap-y-1 text-caption text-ink-soft">{children}</ul>;
}
