/**
 * Three glyphs that differ in outline as well as inner sign, so a mark reads
 * without colour (printed in grey, or for a colour-blind reader):
 * circle + tick, square + cross, diamond + question mark.
 */
interface GlyphProps {
  className?: string;
}

const common = {
  viewBox: '0 0 16 16',
  fill: 'none',
  stroke: 'currentColor',
  strokeWidth: 1.6,
  strokeLinecap: 'round' as const,
  strokeLinejoin: 'round' as const,
  'aria-hidden': true,
  focusable: false,
};

export function CircleTickGlyph({ className = 'size-4' }: GlyphProps) {
  return (
    <svg {...common} className={className} data-glyph="circle-tick">
      <circle cx="8" cy="8" r="6.6" />
      <path d="M5 8.3 7.1 10.3 11 5.9" />
    </svg>
  );
}

export function SquareCrossGlyph({ className = 'size-4' }: GlyphProps) {
  return (
    <svg {...common} className={className} data-glyph="square-cross">
      <rect x="1.6" y="1.6" width="12.8" height="12.8" rx="1" />
      <path d="M5.4 5.4 10.6 10.6M10.6 5.4 5.4 10.6" />
    </svg>
  );
}

export function DiamondQuestionGlyph({ className = 'size-4' }: GlyphProps) {
  return (
    <svg {...common} className={className} data-glyph="diamond-question">
      <path d="M8 0.9 15.1 8 8 15.1 0.9 8Z" />
      <path d="M6.4 6.5a1.7 1.7 0 1 1 2.3 1.6c-.45.2-.7.55-.7 1v.4" strokeWidth="1.4" />
      <circle cx="8" cy="11.2" r="0.35" fill="currentColor" strokeWidth="0.9" />
    </svg>
  );
}

export function WarningTriangleGlyph({ className = 'size-5' }: GlyphProps) {
  return (
    <svg viewBox="0 0 20 18" className={className} aria-hidden="true" focusable="false" data-glyph="warning-triangle">
      <path d="M10 1.2 19 16.8H1Z" fill="var(--color-caution)" stroke="var(--color-ink)" strokeWidth="1.5" strokeLinejoin="round" />
      <path d="M10 6.4v5" stroke="var(--color-ink)" strokeWidth="1.8" strokeLinecap="round" />
      <circle cx="10" cy="14" r="1.05" fill="var(--color-ink)" />
    </svg>
  );
}
