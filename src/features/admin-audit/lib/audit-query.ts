export interface AuditFilters {
  actor: string;
  action: string;
  subjectType: string;
  subjectId: string;
  from: string;
  to: string;
}

export const EMPTY_AUDIT_FILTERS: AuditFilters = { actor: '', action: '', subjectType: '', subjectId: '', from: '', to: '' };

/** The filters as query parameters, leaving out empty ones (shared by the table and the CSV link). */
export function auditSearchParams(filters: AuditFilters, extra: Record<string, string> = {}): URLSearchParams {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value.trim() !== '') params.set(key, value.trim());
  for (const [key, value] of Object.entries(extra)) params.set(key, value);
  return params;
}

export function auditFiltersFrom(params: URLSearchParams): AuditFilters {
  const read = (key: keyof AuditFilters) => params.get(key) ?? '';
  return { actor: read('actor'), action: read('action'), subjectType: read('subjectType'), subjectId: read('subjectId'), from: read('from'), to: read('to') };
}

/** A short human line for an event's details: its most telling fields, not the raw JSON (record ids stay in the CSV). */
export function summariseDetails(details: Record<string, unknown>): string {
  const parts: string[] = [];
  for (const [key, value] of Object.entries(details)) {
    if (value === null || value === undefined || key.endsWith('Id')) continue;
    const shown = Array.isArray(value) ? value.join(', ') : typeof value === 'object' ? JSON.stringify(value) : String(value);
    parts.push(`${key}: ${shown}`);
  }
  return parts.join(' · ');
}
