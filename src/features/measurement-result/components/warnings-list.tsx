import { DiamondQuestionGlyph } from '@/components/ui/mark-glyphs';

export interface WarningsListProps {
  warnings: readonly string[];
}

/** The analysis's warnings, each a sentence to act on; says so plainly when there are none. */
export function WarningsList({ warnings }: WarningsListProps) {
  if (warnings.length === 0) {
    return (
      <p className="text-small text-ink-faint" data-role="warnings-empty">
        The analysis raised no warnings.
      </p>
    );
  }
  return (
    <ul className="space-y-2" aria-label="Analysis warnings" data-role="warnings">
      {warnings.map((warning, index) => (
        <li key={index} className="flex gap-3 rounded-sheet border border-undecided/35 bg-undecided-tint/50 px-3 py-2 text-small text-ink">
          <DiamondQuestionGlyph className="mt-0.5 size-4 shrink-0 text-undecided" />
          <span>{warning}</span>
        </li>
      ))}
    </ul>
  );
}
