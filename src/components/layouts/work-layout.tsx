import type { ReactNode } from 'react';
import { Link, NavLink } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { ParaxiaWordmark } from '@/components/layouts/paraxia-wordmark';
import type { NavigationGroup } from '@/lib/authorization';

export interface WorkLayoutPerson {
  name: string;
  email: string;
  /** e.g. "Technician · Reviewer". */
  rolesText: string;
  organisationName: string | null;
  organisationKind: 'lab' | 'client' | null;
}

export interface WorkLayoutProps {
  person: WorkLayoutPerson;
  navigation: NavigationGroup[];
  onSignOut: () => void;
  isSigningOut: boolean;
  signOutProblem: string | null;
  children: ReactNode;
}

/**
 * The signed-in frame: a slim top bar (lab, person, sign-out) and a margin
 * rail listing the stages of the work this person's roles reach, like the
 * ruled margin of a lab notebook.
 */
export function WorkLayout({ person, navigation, onSignOut, isSigningOut, signOutProblem, children }: WorkLayoutProps) {
  return (
    <div className="flex min-h-dvh flex-col">
      <a href="#main" className="sr-only-focusable rounded-sheet bg-ink px-3 py-2 text-sheet">
        Skip to the page
      </a>
      <header className="sticky top-0 z-20 border-b border-rule bg-sheet/95 backdrop-blur-sm">
        <div className="flex h-bar items-center gap-4 px-4 md:px-6">
          <Link to="/" className="rounded-hair text-ink" aria-label="Paraxia, home">
            <ParaxiaWordmark />
          </Link>
          {person.organisationName ? (
            <span className="hidden border-l border-rule pl-4 text-small text-ink-soft sm:inline">
              {person.organisationName}
              {person.organisationKind === 'client' ? <span className="text-ink-faint"> · client access</span> : null}
            </span>
          ) : null}
          <div className="ml-auto flex items-center gap-3">
            <div className="text-right leading-tight">
              <p className="text-small font-semibold text-ink">{person.name}</p>
              <p className="text-caption text-ink-faint">{person.rolesText}</p>
            </div>
            <Button variant="secondary" size="sm" onClick={onSignOut} isBusy={isSigningOut}>
              Sign out
            </Button>
          </div>
        </div>
        {signOutProblem ? (
          <p role="alert" className="border-t border-nonconform/40 bg-nonconform-tint px-6 py-1.5 text-small text-ink">
            {signOutProblem}
          </p>
        ) : null}
      </header>

      <div className="flex flex-1 flex-col md:flex-row">
        <nav
          aria-label="Work trail"
          className="border-b border-rule bg-paper px-4 py-3 md:w-rail md:shrink-0 md:border-b-0 md:border-r-[3px] md:border-double md:border-r-rule-strong md:px-5 md:py-6"
        >
          <ol className="flex flex-wrap gap-x-6 gap-y-4 md:flex-col">
            {navigation.map((group) => (
              <li key={group.label}>
                <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">{group.label}</p>
                <ul className="mt-1.5 border-l border-rule md:ml-1">
                  {group.entries.map((entry) => (
                    <li key={entry.to}>
                      <NavLink
                        to={entry.to}
                        end
                        className={({ isActive }) =>
                          `relative -ml-px flex items-center border-l-2 py-1 pl-3 pr-2 text-body ${
                            isActive
                              ? 'border-ink font-semibold text-ink'
                              : 'border-transparent text-ink-soft hover:border-rule-strong hover:text-ink'
                          }`
                        }
                      >
                        {entry.label}
                      </NavLink>
                    </li>
                  ))}
                </ul>
              </li>
            ))}
          </ol>
        </nav>

        <main id="main" tabIndex={-1} className="min-w-0 flex-1 px-4 py-6 md:px-10 md:py-8">
          <div className="mx-auto max-w-6xl">{children}</div>
        </main>
      </div>
    </div>
  );
}
