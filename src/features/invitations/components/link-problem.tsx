import { Link } from 'react-router-dom';
import { SquareCrossGlyph } from '@/components/ui/mark-glyphs';

/** A link that cannot be used (unknown, used, withdrawn or expired): the server's sentence and a way on. */
export function LinkProblem({ message, showForgotPassword }: { message: string; showForgotPassword?: boolean }) {
  return (
    <div className="space-y-6">
      <div role="alert" className="flex gap-2.5 rounded-sheet border border-nonconform/40 bg-nonconform-tint/70 px-3 py-2.5 text-small">
        <SquareCrossGlyph className="mt-0.5 size-4 shrink-0 text-nonconform" />
        <p className="font-medium text-ink">{message}</p>
      </div>
      <p className="text-small text-ink-soft">
        <Link to={showForgotPassword ? '/sign-in?forgot=1' : '/sign-in'} className="font-medium text-ink underline underline-offset-2">
          {showForgotPassword ? 'Ask for a new password link' : 'Go to the sign-in page'}
        </Link>
      </p>
    </div>
  );
}
