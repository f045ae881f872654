import { useNavigate, useParams } from 'react-router-dom';
import { SignInLayout } from '@/components/layouts/sign-in-layout';
import { LoadingNote } from '@/components/ui/loading-note';
import { describeRoles } from '@/lib/authorization';
import { useInvitationLink } from '@/features/invitations/api/get-invitation-link';
import { ChoosePasswordForm } from '@/features/invitations/components/choose-password-form';
import { LinkProblem } from '@/features/invitations/components/link-problem';

export function AcceptInvitationRoute() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const invitation = useInvitationLink(token);
  return (
    <SignInLayout>
      <title>Accept your invitation · Paraxia</title>
      <h1 className="text-title-lg">Accept your invitation</h1>
      <div className="mt-6">
        {invitation.isPending ? (
          <LoadingNote what="your invitation" />
        ) : invitation.isError ? (
          <LinkProblem message={invitation.error.message} />
        ) : (
          <div className="space-y-6">
            <p className="text-body text-ink-soft">
              <span className="font-medium text-ink">{invitation.data.name}</span>, {invitation.data.labName} invited you to Paraxia as{' '}
              {describeRoles(invitation.data.roles).toLowerCase()}
              {invitation.data.organisationName ? ` for ${invitation.data.organisationName}` : ''}. Choose a password to
              create your account.
            </p>
            <p className="rounded-sheet border border-rule bg-sheet px-3 py-2 text-small">
              <span className="text-ink-faint">You will sign in as </span>
              <span className="numerals text-ink">{invitation.data.email}</span>
            </p>
            <ChoosePasswordForm
              kind="invitation"
              token={token}
              email={invitation.data.email}
              submitLabel="Create my account"
              onDone={() => navigate('/', { replace: true })}
            />
          </div>
        )}
      </div>
      <p className="mt-10 border-t border-rule pt-4 text-caption text-ink-faint">
        The link works once. Nobody at the lab sees the password you choose.
      </p>
    </SignInLayout>
  );
}
