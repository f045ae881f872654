import { WarningTriangleGlyph } from '@/components/ui/mark-glyphs';

export interface SafetyNoteProps {
  /** `bench` for pages where people set up or run the bench; `certificate` for issued results. */
  context?: 'bench' | 'certificate';
  className?: string;
}

const CAUTIONS = {
  bench: {
    title: 'Bench safety',
    points: [
      'Never look into a collimated beam or a laser, directly or through the lens under test.',
      'Keep a focusing lens away from sunlight and anything flammable; it can start a fire.',
      'Follow the laser class of your source and your lab’s local rules.',
    ],
  },
  certificate: {
    title: 'About this certificate',
    points: [
      'A certificate from Paraxia is the issuing lab’s own statement.',
      'Accreditation, traceability claims and conformity decisions remain the lab’s responsibility under its quality system and local regulations.',
    ],
  },
} as const;

/** A short caution strip, shown where a person meets the hazard or the claim. */
export function SafetyNote({ context = 'bench', className = '' }: SafetyNoteProps) {
  const caution = CAUTIONS[context];
  return (
    <aside
      aria-label={caution.title}
      className={`relative flex gap-3 overflow-hidden rounded-sheet border border-rule bg-sheet py-2.5 pl-5 pr-3 shadow-sheet ${className}`}
    >
      <span
        aria-hidden="true"
        className="absolute inset-y-0 left-0 w-1.5"
        style={{ background: 'repeating-linear-gradient(135deg, var(--color-ink) 0 4px, var(--color-caution) 4px 8px)' }}
      />
      <WarningTriangleGlyph className="mt-0.5 size-5 shrink-0" />
      <div className="text-small text-ink-soft">
        <p className="font-semibold text-ink">{caution.title}</p>
        <ul className="mt-0.5 list-none space-y-0.5">
          {caution.points.map((point) => (
            <li key={point}>{point}</li>
          ))}
        </ul>
      </div>
    </aside>
  );
}
