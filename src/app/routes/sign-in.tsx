import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { SignInLayout } from '@/components/layouts/sign-in-layout';
import { LoadingNote } from '@/components/ui/loading-note';
import { safeRedirectPath } from '@/lib/authorization';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { DEMO_ACCOUNTS } from '@/features/auth/components/demo-accounts';
import { SignInForm } from '@/features/auth/components/sign-in-form';
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form';

export function SignInRoute() {
  const [searchParams, setSearchParams] = useSearchParams();
  const forgot = searchParams.get('forgot') === '1';
  const navigate = useNavigate();
  const redirectTo = safeRedirectPath(searchParams.get('redirectTo'));
  // Also sets the CSRF cookie the sign-in POST needs.
  const currentUser = useCurrentUser();

  if (currentUser.data) return <Navigate to={redirectTo} replace />;

  return (
    <SignInLayout>
      <title>Sign in · Paraxia</title>
      <h1 className="text-title-lg">{forgot ? 'Forgot your password?' : 'Sign in'}</h1>
      {forgot ? null : <p className="mt-2 text-body text-ink-soft">Use the e-mail address your lab registered for you.</p>}
      <div className="mt-8">
        {currentUser.isPending ? (
          <LoadingNote what="your session" />
        ) : forgot ? (
          <ForgotPasswordForm onBack={() => setSearchParams((params) => { params.delete('forgot'); return params; })} />
        ) : (
          <>
            <SignInForm
              onSignedIn={() => navigate(redirectTo, { replace: true })}
              demoAccounts={import.meta.env.DEV ? DEMO_ACCOUNTS : undefined}
            />
            <p className="mt-4 text-center text-small">
              <button type="button" onClick={() => setSearchParams((params) => { params.set('forgot', '1'); return params; })} className="text-ink-soft underline underline-offset-2 hover:text-ink">
                Forgot your password?
              </button>
            </p>
          </>
        )}
      </div>
      <p className="mt-10 border-t border-rule pt-4 text-caption text-ink-faint">
        No sign-in yet? Your lab’s administrator sends invitations. Clients receive theirs from the lab that measures
        their lenses.
      </p>
    </SignInLayout>
  );
}
