import type { AuditEventRow } from '../../../shared/schemas/admin';

/**
 * One CSV cell. Quoting follows RFC 4180 §2 (fields with a comma, quote or
 * line break are quoted, quotes doubled). A cell that a spreadsheet would
 * read as a formula (starting with = + - @, or a tab or carriage return)
 * gets a leading apostrophe: OWASP "CSV Injection" guidance.
 */
export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  let text = String(value);
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export const AUDIT_CSV_HEADER = ['time_utc', 'actor_name', 'actor_email', 'action', 'subject_type', 'subject_id', 'details', 'ip'];

/** The header line, CRLF-terminated (RFC 4180). */
export const AUDIT_CSV_HEADER_LINE = `${AUDIT_CSV_HEADER.join(',')}\r\n`;

/** The audit rows as CSV lines, each CRLF-terminated (RFC 4180), without the header. */
export function auditRowsToCsvLines(rows: readonly AuditEventRow[]): string {
  let text = '';
  for (const row of rows) {
    text += `${[row.at, row.actor?.name, row.actor?.email, row.action, row.subjectType, row.subjectId, JSON.stringify(row.details), row.ip].map(csvCell).join(',')}\r\n`;
  }
  return text;
}

/** The audit rows as CSV text with a header and CRLF line ends (RFC 4180). */
export function auditEventsToCsv(rows: readonly AuditEventRow[]): string {
  return AUDIT_CSV_HEADER_LINE + auditRowsToCsvLines(rows);
}
