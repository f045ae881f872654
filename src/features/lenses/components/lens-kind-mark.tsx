import type { LensKind } from '@shared/schemas/lenses';

/** A lens section in outline: bulging faces for converging, hollow faces for diverging. */
export function LensKindGlyph({ kind, className = 'h-4 w-3' }: { kind: LensKind; className?: string }) {
  return (
    <svg viewBox="0 0 12 16" className={className} aria-hidden="true" focusable="false" data-glyph={`lens-${kind}`}>
      {kind === 'converging' ? (
        <path d="M6 1C9.2 4.5 9.2 11.5 6 15 2.8 11.5 2.8 4.5 6 1Z" fill="none" stroke="currentColor" strokeWidth={1.3} strokeLinejoin="round" />
      ) : (
        <path d="M1.8 1h8.4C7.9 4.8 7.9 11.2 10.2 15H1.8C4.1 11.2 4.1 4.8 1.8 1Z" fill="none" stroke="currentColor" strokeWidth={1.3} strokeLinejoin="round" />
      )}
    </svg>
  );
}

export function LensKindMark({ kind }: { kind: LensKind }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-ink-soft" data-kind={kind}>
      <LensKindGlyph kind={kind} />
      <span>{kind === 'converging' ? 'Converging' : 'Diverging'}</span>
    </span>
  );
}
