import { isApiError } from '@/lib/api-client';

export interface ServerProblems {
  /** Sentences the form shows beside its own fields, keyed by request field name. */
  byField: Partial<Record<string, string>>;
  /** What no field of the form can show (or the whole message when the server named no field); null when nothing is left over. */
  leftOver: string | null;
}

/**
 * Splits a failed save into the sentences shown beside fields and the rest,
 * so nothing the server said is lost because the form has no place for it.
 */
export function splitServerProblems(error: unknown, shownFields: readonly string[]): ServerProblems {
  if (!error) return { byField: {}, leftOver: null };
  if (!isApiError(error)) return { byField: {}, leftOver: error instanceof Error ? error.message : String(error) };
  const entries = Object.entries(error.fields);
  if (entries.length === 0) return { byField: {}, leftOver: error.message };
  const byField: Partial<Record<string, string>> = {};
  const rest: string[] = [];
  for (const [field, sentence] of entries) {
    if (shownFields.includes(field)) byField[field] = sentence;
    else rest.push(sentence);
  }
  return { byField, leftOver: rest.length > 0 ? rest.join(' ') : null };
}
