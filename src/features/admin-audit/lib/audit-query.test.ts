import { describe, expect, it } from 'vitest';
import { auditFiltersFrom, auditSearchParams, EMPTY_AUDIT_FILTERS, summariseDetails } from '@/features/admin-audit/lib/audit-query';

describe('audit filters as query parameters', () => {
  it('leaves out empty filters and round-trips the rest', () => {
    const filters = { ...EMPTY_AUDIT_FILTERS, action: 'person.', from: '2026-12-01' };
    const params = auditSearchParams(filters, { page: '2' });
    expect(params.toString()).toBe('action=person.&from=2026-12-01&page=2');
    expect(auditFiltersFrom(params)).toEqual(filters);
  });
});

describe('summariseDetails', () => {
  it('joins fields, lists arrays and skips empty values and record ids', () => {
    expect(summariseDetails({ before: ['technician'], after: ['technician', 'reviewer'], note: null, contactId: 'c0ffee' })).toBe('before: technician · after: technician, reviewer');
  });
});
