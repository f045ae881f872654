import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { SignInLayout } from '@/components/layouts/sign-in-layout';
import { LoadingNote } from '@/components/ui/loading-note';
import { safeRedirectPath } from '@/lib/authorization';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { DEMO_ACCOUNTS } from '@/features/auth/components/demo-accounts';
import { SignInForm } from '@/features/auth/components/sign-in-form';

export function SignInRoute() {
  const [searchParams] = useSearchParams();
  const navigate = useNavigate();
  const redirectTo = safeRedirectPath(searchParams.get('redirectTo'));
  // Also sets the CSRF cookie the sign-in POST needs.
  const currentUser = useCurrentUser();

  if (currentUser.data) return <Navigate to={redirectTo} replace />;

  return (
    <SignInLayout>
      <title>Sign in · Paraxia</title>
      <h1 className="text-title-lg">Sign in</h1>
      <p className="mt-2 text-body text-ink-soft">Use the e-mail address your lab registered for you.</p>
      <div className="mt-8">
        {currentUser.isPending ? (
          <LoadingNote what="your session" />
        ) : (
          <SignInForm
            onSignedIn={() => navigate(redirectTo, { replace: true })}
            demoAccounts={import.meta.env.DEV ? DEMO_ACCOUNTS : undefined}
          />
        )}
      </div>
      <p className="mt-10 border-t border-rule pt-4 text-caption text-ink-faint">
        No sign-in yet? Your lab’s administrator sends invitations. Clients receive theirs from the lab that measures
        their lenses.
      </p>
    </SignInLayout>
  );
}
