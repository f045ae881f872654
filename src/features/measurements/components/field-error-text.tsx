import { SquareCrossGlyph } from '@/components/ui/mark-glyphs';

/** A field's problem as a sentence under it, with the same mark TextField uses. */
export function FieldErrorText({ id, children }: { id?: string; children: string }) {
  return (
    <p id={id} className="flex items-start gap-1.5 text-small text-nonconform" data-role="field-error">
      <SquareCrossGlyph className="mt-[0.2em] size-3.5 shrink-0" />
      {children}
    </p>
  );
}
