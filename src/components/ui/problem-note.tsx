import type { ReactNode } from 'react';
import { SquareCrossGlyph } from '@/components/ui/mark-glyphs';

export interface ProblemNoteProps {
  title: string;
  /** The sentence to act on, usually an ApiError's message. */
  message: string;
  action?: ReactNode;
}

/** A failure inside one region of a page; the rest of the page keeps working. */
export function ProblemNote({ title, message, action }: ProblemNoteProps) {
  return (
    <div role="alert" className="flex gap-3 rounded-sheet border border-nonconform/40 bg-nonconform-tint/60 px-4 py-3">
      <SquareCrossGlyph className="mt-0.5 size-4 shrink-0 text-nonconform" />
      <div className="flex-1 text-small">
        <p className="font-semibold text-ink">{title}</p>
        <p className="mt-0.5 text-ink-soft">{message}</p>
        {action ? <div className="mt-2">{action}</div> : null}
      </div>
    </div>
  );
}
