/** Parallel rays through a converging lens meeting at its focus (the cobalt point). */
export function ConvergingLensIllustration({ className = 'w-full' }: { className?: string }) {
  const rayHeights = [34, 50, 90, 106];
  const lensX = 92;
  const focus = { x: 172, y: 70 };
  return (
    <svg viewBox="0 0 220 140" className={className} fill="none" aria-hidden="true" focusable="false">
      <line x1="6" y1="70" x2="214" y2="70" stroke="currentColor" strokeWidth="0.8" strokeDasharray="6 3 1 3" opacity="0.55" />
      {rayHeights.map((y) => {
        const slope = (focus.y - y) / (focus.x - lensX);
        return (
          <path
            key={y}
            d={`M8 ${y} H${lensX} L${focus.x} ${focus.y} L${focus.x + 36} ${focus.y + slope * 36}`}
            stroke="currentColor"
            strokeWidth="1.1"
            strokeLinejoin="round"
            opacity="0.8"
          />
        );
      })}
      {rayHeights.map((y) => (
        <path key={`arrow-${y}`} d={`M40 ${y - 3} L46 ${y} L40 ${y + 3}`} stroke="currentColor" strokeWidth="1.1" opacity="0.8" />
      ))}
      <path
        d={`M${lensX} 16 C${lensX + 15} 46 ${lensX + 15} 94 ${lensX} 124 C${lensX - 15} 94 ${lensX - 15} 46 ${lensX} 16 Z`}
        fill="var(--color-sheet)"
        stroke="currentColor"
        strokeWidth="1.6"
      />
      <line x1={lensX} y1="22" x2={lensX} y2="118" stroke="currentColor" strokeWidth="0.6" strokeDasharray="2 3" opacity="0.6" />
      <line x1={focus.x} y1="60" x2={focus.x} y2="80" stroke="var(--color-focus)" strokeWidth="1" opacity="0.6" />
      <circle cx={focus.x} cy={focus.y} r="3.6" fill="var(--color-focus)" />
      <text x={focus.x + 2} y="92" fill="var(--color-focus)" fontSize="10" fontFamily="var(--font-serif)" fontStyle="italic">
        F′
      </text>
      <path d={`M${lensX} 132 H${focus.x}`} stroke="currentColor" strokeWidth="0.8" />
      <path d={`M${lensX} 128 V136 M${focus.x} 128 V136`} stroke="currentColor" strokeWidth="0.8" />
      <text x={(lensX + focus.x) / 2 - 3} y="128" fill="currentColor" fontSize="9" fontFamily="var(--font-serif)" fontStyle="italic">
        f′
      </text>
    </svg>
  );
}
