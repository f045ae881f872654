/** A certificate sheet with a folded corner and a round seal holding a small lens and its focus. */
export function CertificateSheetIllustration({ className = 'w-full' }: { className?: string }) {
  return (
    <svg viewBox="0 0 220 140" className={className} fill="none" aria-hidden="true" focusable="false">
      <path d="M62 10 H146 L162 26 V132 H62 Z" fill="var(--color-sheet)" stroke="currentColor" strokeWidth="1.4" strokeLinejoin="round" />
      <path d="M146 10 V26 H162" stroke="currentColor" strokeWidth="1.2" strokeLinejoin="round" />
      <line x1="74" y1="26" x2="124" y2="26" stroke="currentColor" strokeWidth="2.2" />
      {[42, 52, 62, 72].map((y, i) => (
        <line key={y} x1="74" y1={y} x2={i % 2 === 0 ? 150 : 136} y2={y} stroke="currentColor" strokeWidth="0.9" opacity="0.6" />
      ))}
      <text x="74" y="92" fill="currentColor" fontSize="11" fontFamily="var(--font-mono)">
        f′ =
      </text>
      <line x1="104" y1="89" x2="130" y2="89" stroke="currentColor" strokeWidth="1.2" />
      <circle cx="136" cy="112" r="14" stroke="currentColor" strokeWidth="1.2" />
      <circle cx="136" cy="112" r="10.5" stroke="currentColor" strokeWidth="0.7" strokeDasharray="1.5 1.8" />
      <path d="M136 104 C139 108 139 116 136 120 C133 116 133 108 136 104 Z" stroke="currentColor" strokeWidth="1" />
      <path d="M127 108 H136 L144 112 M127 116 H136 L144 112" stroke="currentColor" strokeWidth="0.8" />
      <circle cx="144" cy="112" r="1.6" fill="var(--color-focus)" />
      <line x1="74" y1="112" x2="112" y2="112" stroke="currentColor" strokeWidth="0.9" opacity="0.6" />
      <line x1="74" y1="120" x2="104" y2="120" stroke="currentColor" strokeWidth="0.9" opacity="0.6" />
    </svg>
  );
}
