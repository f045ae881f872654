/** A through-focus sharpness curve: sampled frames, the fitted model, and its peak in cobalt. */
export function FocusCurveIllustration({ className = 'w-full' }: { className?: string }) {
  const left = 16;
  const right = 204;
  const base = 116;
  const peakX = 118;
  const width = 30;
  const curveY = (x: number) => base - 86 / (1 + ((x - peakX) / width) ** 2);
  const curve = Array.from({ length: 95 }, (_, i) => {
    const x = left + (i * (right - left)) / 94;
    return `${i === 0 ? 'M' : 'L'}${x.toFixed(1)} ${curveY(x).toFixed(1)}`;
  }).join(' ');
  const scatter = [-3, 2, -2, 4, -1, 3, -4, 1, 2, -2, 3, -1];
  const samples = scatter.map((offset, i) => {
    const x = left + 8 + i * 16;
    return { x, y: curveY(x) + offset };
  });
  return (
    <svg viewBox="0 0 220 140" className={className} fill="none" aria-hidden="true" focusable="false">
      <path d={`M${left} 12 V${base} H${right}`} stroke="currentColor" strokeWidth="1.1" />
      {[40, 64, 88, 112, 136, 160, 184].map((x) => (
        <line key={x} x1={x} y1={base} x2={x} y2={base + 4} stroke="currentColor" strokeWidth="0.8" />
      ))}
      <path d={curve} stroke="currentColor" strokeWidth="1.4" />
      {samples.map((point) => (
        <circle key={point.x} cx={point.x} cy={point.y} r="2.2" fill="var(--color-sheet)" stroke="currentColor" strokeWidth="1" />
      ))}
      <line x1={peakX} y1="22" x2={peakX} y2={base} stroke="var(--color-focus)" strokeWidth="1.2" strokeDasharray="4 2" />
      <path d={`M${peakX - 5} ${curveY(peakX) - 9} L${peakX} ${curveY(peakX) - 3} L${peakX + 5} ${curveY(peakX) - 9} Z`} fill="var(--color-focus)" />
      <text x={peakX + 6} y="132" fill="currentColor" fontSize="9" fontFamily="var(--font-mono)">
        z
      </text>
    </svg>
  );
}
