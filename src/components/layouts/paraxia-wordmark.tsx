/** The Paraxia mark: a lens bringing two rays to a cobalt focus, beside the name in serif. */
export function ParaxiaWordmark({ size = 'md' }: { size?: 'md' | 'lg' }) {
  const large = size === 'lg';
  return (
    <span className="inline-flex items-center gap-2">
      <svg viewBox="0 0 32 32" className={large ? 'size-10' : 'size-7'} fill="none" aria-hidden="true" focusable="false">
        <path d="M3 10 L16 10 L27 16 M3 22 L16 22 L27 16" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
        <path d="M16 5 C19.5 10 19.5 22 16 27 C12.5 22 12.5 10 16 5 Z" fill="var(--color-sheet)" stroke="currentColor" strokeWidth="1.6" />
        <circle cx="27" cy="16" r="2.4" fill="var(--color-focus)" />
      </svg>
      <span className={`font-serif font-semibold tracking-tight text-ink ${large ? 'text-title-lg' : 'text-title-sm'}`}>Paraxia</span>
    </span>
  );
}
