import { ROLE_LABELS } from '@/lib/authorization';
import type { AdminPersonSummary, PersonRole } from '@shared/schemas/admin';

const LAB_ROLES: PersonRole[] = ['technician', 'reviewer', 'admin'];

export interface RoleChipsProps {
  person: AdminPersonSummary;
  disabled?: boolean;
  onChange: (roles: PersonRole[]) => void;
}

/**
 * A lab person's roles as switches (held = filled); a client person only ever
 * holds the client role, shown but not switchable. At least one role stays on.
 */
export function RoleChips({ person, disabled, onChange }: RoleChipsProps) {
  if (person.organisation?.kind === 'client') {
    return <span className="rounded-hair border border-rule bg-paper px-1.5 text-caption text-ink-soft">{ROLE_LABELS.client}</span>;
  }
  return (
    <span className="flex flex-wrap gap-1" role="group" aria-label={`Roles of ${person.name}`}>
      {LAB_ROLES.map((role) => {
        const held = person.roles.includes(role);
        const isOnlyRole = held && person.roles.length === 1;
        return (
          <button
            key={role}
            type="button"
            aria-pressed={held}
            disabled={disabled || isOnlyRole}
            title={isOnlyRole ? 'A person keeps at least one role; deactivate them instead.' : held ? `Remove ${ROLE_LABELS[role]}` : `Add ${ROLE_LABELS[role]}`}
            onClick={() => onChange(held ? person.roles.filter((r) => r !== role) : [...person.roles, role])}
            className={`rounded-hair border px-1.5 text-caption transition-colors disabled:cursor-not-allowed ${
              held ? 'border-ink bg-ink text-sheet hover:bg-ink-soft' : 'border-dashed border-rule-strong bg-transparent text-ink-faint hover:bg-shade hover:text-ink'
            }`}
          >
            {held ? '' : '+ '}
            {ROLE_LABELS[role]}
          </button>
        );
      })}
    </span>
  );
}
