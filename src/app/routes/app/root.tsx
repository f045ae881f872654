import { Navigate, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { WorkLayout } from '@/components/layouts/work-layout';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { describeRoles, navigationFor } from '@/lib/authorization';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { useSignOut } from '@/features/auth/api/sign-out';

/** Everything behind sign-in: the guard, then the layout around the page. */
export function AppRoot() {
  const currentUser = useCurrentUser();
  const location = useLocation();
  const navigate = useNavigate();
  const signOut = useSignOut({ onSignedOut: () => navigate('/sign-in', { replace: true }) });

  if (currentUser.isPending) {
    return (
      <div className="mx-auto mt-24 max-w-md px-4">
        <LoadingNote what="your session" />
      </div>
    );
  }
  if (currentUser.isError) {
    return (
      <div className="mx-auto mt-24 max-w-md px-4">
        <ProblemNote
          title="Paraxia could not check who is signed in"
          message={currentUser.error.message}
          action={
            <Button variant="secondary" size="sm" onClick={() => currentUser.refetch()} isBusy={currentUser.isFetching}>
              Try again
            </Button>
          }
        />
      </div>
    );
  }
  const user = currentUser.data;
  if (!user) {
    const here = `${location.pathname}${location.search}`;
    const target = here === '/' ? '/sign-in' : `/sign-in?redirectTo=${encodeURIComponent(here)}`;
    return <Navigate to={target} replace />;
  }

  return (
    <WorkLayout
      person={{
        name: user.name,
        email: user.email,
        rolesText: describeRoles(user.roles),
        organisationName: user.organisation?.name ?? null,
        organisationKind: user.organisation?.kind ?? null,
      }}
      navigation={navigationFor(user)}
      onSignOut={() => signOut.mutate()}
      isSigningOut={signOut.isPending}
      signOutProblem={signOut.error ? `Sign-out did not complete: ${signOut.error.message}` : null}
    >
      <RegionErrorBoundary key={location.pathname} region="This page">
        <Outlet />
      </RegionErrorBoundary>
    </WorkLayout>
  );
}
