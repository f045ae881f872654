import type { ReactNode } from 'react';
import { CircleTickGlyph, DiamondQuestionGlyph, SquareCrossGlyph } from '@/components/ui/mark-glyphs';

export type ConformityDecision = 'conforms' | 'does-not-conform' | 'undecided';

export const CONFORMITY_WORDS: Record<ConformityDecision, string> = {
  conforms: 'Conforms',
  'does-not-conform': 'Does not conform',
  undecided: 'Undecided',
};

const LOOK: Record<ConformityDecision, { classes: string; glyph: (className: string) => ReactNode }> = {
  conforms: {
    classes: 'text-conforms bg-conforms-tint border-conforms/35',
    glyph: (className) => <CircleTickGlyph className={className} />,
  },
  'does-not-conform': {
    classes: 'text-nonconform bg-nonconform-tint border-nonconform/35',
    glyph: (className) => <SquareCrossGlyph className={className} />,
  },
  undecided: {
    classes: 'text-undecided bg-undecided-tint border-undecided/35',
    glyph: (className) => <DiamondQuestionGlyph className={className} />,
  },
};

const SIZES = {
  sm: { box: 'gap-1 px-1.5 py-px text-caption', glyph: 'size-3.5' },
  md: { box: 'gap-1.5 px-2 py-0.5 text-small', glyph: 'size-4' },
  lg: { box: 'gap-2 px-3 py-1 text-lead', glyph: 'size-5' },
} as const;

export interface ConformityMarkProps {
  decision: ConformityDecision;
  size?: keyof typeof SIZES;
  /** A short reason shown after the word, e.g. "tolerance ± 1 %". */
  detail?: string;
}

/** A conformity decision as word + shape + colour; never colour alone. */
export function ConformityMark({ decision, size = 'md', detail }: ConformityMarkProps) {
  const look = LOOK[decision];
  const sizing = SIZES[size];
  return (
    <span
      className={`inline-flex max-w-full flex-wrap items-center rounded-hair border font-medium ${look.classes} ${sizing.box}`}
      data-decision={decision}
    >
      {look.glyph(sizing.glyph)}
      <span className="whitespace-nowrap">{CONFORMITY_WORDS[decision]}</span>
      {detail ? <span className="whitespace-nowrap font-normal opacity-85">· {detail}</span> : null}
    </span>
  );
}
