/** Rays spreading from a diverging lens: no real image forms; the dashed lines trace back to a virtual focus. */
export function DivergingLensIllustration({ className = 'w-full' }: { className?: string }) {
  const rayHeights = [40, 56, 84, 100];
  const lensX = 120;
  const virtualFocus = { x: 60, y: 70 };
  return (
    <svg viewBox="0 0 220 140" className={className} fill="none" aria-hidden="true" focusable="false">
      <line x1="6" y1="70" x2="214" y2="70" stroke="currentColor" strokeWidth="0.8" strokeDasharray="6 3 1 3" opacity="0.55" />
      {rayHeights.map((y) => {
        const slope = (y - virtualFocus.y) / (lensX - virtualFocus.x);
        const endX = 212;
        return (
          <g key={y}>
            <path d={`M8 ${y} H${lensX} L${endX} ${y + slope * (endX - lensX)}`} stroke="currentColor" strokeWidth="1.1" opacity="0.8" />
            <path
              d={`M${lensX} ${y} L${virtualFocus.x} ${virtualFocus.y}`}
              stroke="currentColor"
              strokeWidth="0.8"
              strokeDasharray="3 3"
              opacity="0.55"
            />
          </g>
        );
      })}
      <path
        d={`M${lensX - 9} 18 H${lensX + 9} C${lensX + 2} 46 ${lensX + 2} 94 ${lensX + 9} 122 H${lensX - 9} C${lensX - 2} 94 ${lensX - 2} 46 ${lensX - 9} 18 Z`}
        fill="var(--color-sheet)"
        stroke="currentColor"
        strokeWidth="1.6"
      />
      <circle cx={virtualFocus.x} cy={virtualFocus.y} r="3.4" fill="var(--color-sheet)" stroke="var(--color-focus)" strokeWidth="1.4" />
      <text x={virtualFocus.x - 6} y="90" fill="var(--color-focus)" fontSize="10" fontFamily="var(--font-serif)" fontStyle="italic">
        F′
      </text>
    </svg>
  );
}
