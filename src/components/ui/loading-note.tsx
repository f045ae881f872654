export interface LoadingNoteProps {
  /** What is being fetched, e.g. "people". */
  what: string;
}

/** A quiet placeholder while data arrives; announced politely, not as an alarm. */
export function LoadingNote({ what }: LoadingNoteProps) {
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-3 rounded-sheet border border-rule bg-sheet px-4 py-3">
      <span aria-hidden="true" className="relative h-px w-10 overflow-hidden bg-rule">
        <span className="absolute inset-y-0 left-0 w-3 animate-[pulse_1.2s_ease-in-out_infinite] bg-ink-soft" />
      </span>
      <span className="text-small text-ink-faint">Loading {what}…</span>
    </div>
  );
}
