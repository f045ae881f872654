import { useNavigate, useParams } from 'react-router-dom';
import { SignInLayout } from '@/components/layouts/sign-in-layout';
import { LoadingNote } from '@/components/ui/loading-note';
import { usePasswordResetLink } from '@/features/invitations/api/get-password-reset-link';
import { ChoosePasswordForm } from '@/features/invitations/components/choose-password-form';
import { LinkProblem } from '@/features/invitations/components/link-problem';

export function ChoosePasswordRoute() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const reset = usePasswordResetLink(token);
  return (
    <SignInLayout>
      <title>Choose a new password · Paraxia</title>
      <h1 className="text-title-lg">Choose a new password</h1>
      <div className="mt-6">
        {reset.isPending ? (
          <LoadingNote what="your password link" />
        ) : reset.isError ? (
          <LinkProblem message={reset.error.message} showForgotPassword />
        ) : (
          <div className="space-y-6">
            <p className="text-body text-ink-soft">
              For <span className="numerals text-ink">{reset.data.email}</span> at {reset.data.labName}. Saving it signs
              you out everywhere else.
            </p>
            <ChoosePasswordForm
              kind="password-reset"
              token={token}
              email={reset.data.email}
              submitLabel="Save and sign in"
              onDone={() => navigate('/', { replace: true })}
            />
          </div>
        )}
      </div>
      <p className="mt-10 border-t border-rule pt-4 text-caption text-ink-faint">The link works once and expires soon after it was sent.</p>
    </SignInLayout>
  );
}
