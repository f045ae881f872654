import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { DiamondQuestionGlyph } from '@/components/ui/mark-glyphs';
import { hasAnyRole, ROLE_LABELS } from '@/lib/authorization';
import type { Role } from '@/types/api';
import { useCurrentUser } from '@/features/auth/api/get-current-user';

export interface RequireRoleProps {
  roles: Role[];
  children: ReactNode;
}

/** Hides a page from people whose roles cannot use it. The server refuses them regardless. */
export function RequireRole({ roles, children }: RequireRoleProps) {
  const { data: user } = useCurrentUser();
  if (user && hasAnyRole(user, roles)) return <>{children}</>;
  const needed = roles.map((role) => ROLE_LABELS[role].toLowerCase()).join(' or ');
  return (
    <div className="mx-auto mt-10 max-w-lg rounded-sheet border border-rule bg-sheet px-6 py-6 text-center">
      <title>Not for your roles · Paraxia</title>
      <DiamondQuestionGlyph className="mx-auto size-8 text-ink-soft" />
      <h1 className="mt-3 text-title">This page is not part of your work</h1>
      <p className="mt-2 text-body text-ink-soft">
        It is for people with the {needed} role. If you need it, ask your lab’s administrator to add the role to your
        sign-in.
      </p>
      <Link to="/" className="mt-4 inline-block text-body font-medium text-ink underline underline-offset-4">
        Back to your home page
      </Link>
    </div>
  );
}
