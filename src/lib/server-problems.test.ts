import { describe, expect, it } from 'vitest';
import { ApiError } from '@/lib/api-client';
import { splitServerProblems } from '@/lib/server-problems';

describe('splitServerProblems', () => {
  it('splitServerProblems puts each sentence beside its field and keeps what no field can show', () => {
    const error = new ApiError({
      status: 400,
      message: 'Some fields need attention: title, kind.',
      fields: { title: 'Field "title" must not be empty.', kind: 'Field "kind" is unknown.' },
    });
    expect(splitServerProblems(error, ['title', 'dueDate'])).toEqual({
      byField: { title: 'Field "title" must not be empty.' },
      leftOver: 'Field "kind" is unknown.',
    });
  });

  it('an error that names no field is shown whole; no error shows nothing', () => {
    const conflict = new ApiError({ status: 409, message: 'Someone changed this record at the same time.' });
    expect(splitServerProblems(conflict, ['title'])).toEqual({ byField: {}, leftOver: 'Someone changed this record at the same time.' });
    expect(splitServerProblems(null, ['title'])).toEqual({ byField: {}, leftOver: null });
  });
});
