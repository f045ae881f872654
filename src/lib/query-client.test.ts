import { describe, expect, it } from 'vitest';
import { ApiError } from '@/lib/api-client';
import { createQueryClient, shouldRetryQuery } from '@/lib/query-client';

describe('query client', () => {
  it('shouldRetryQuery retries network failures and 5xx twice, never a 4xx', () => {
    expect(shouldRetryQuery(0, new ApiError({ status: 503, message: 'x' }))).toBe(true);
    expect(shouldRetryQuery(2, new ApiError({ status: 503, message: 'x' }))).toBe(false);
    expect(shouldRetryQuery(0, new ApiError({ status: 0, message: 'x' }))).toBe(true);
    expect(shouldRetryQuery(0, new ApiError({ status: 404, message: 'x' }))).toBe(false);
  });

  it('a query answering 401 reports the ended session; other errors do not', async () => {
    let endedSessions = 0;
    const client = createQueryClient({ onUnauthorised: () => endedSessions++ });
    await client
      .fetchQuery({ queryKey: ['a'], queryFn: () => Promise.reject(new ApiError({ status: 401, message: 'Sign in again.' })), retry: false })
      .catch(() => undefined);
    await client
      .fetchQuery({ queryKey: ['b'], queryFn: () => Promise.reject(new ApiError({ status: 403, message: 'No.' })), retry: false })
      .catch(() => undefined);
    expect(endedSessions).toBe(1);
  });

  it('a mutation marked unauthorisedIsAnAnswer (wrong password) does not end the session', async () => {
    let endedSessions = 0;
    const client = createQueryClient({ onUnauthorised: () => endedSessions++ });
    const reject401 = () => Promise.reject(new ApiError({ status: 401, message: 'Wrong password.' }));
    await client.getMutationCache().build(client, { mutationFn: reject401, meta: { unauthorisedIsAnAnswer: true } }).execute(undefined).catch(() => undefined);
    expect(endedSessions).toBe(0);
    await client.getMutationCache().build(client, { mutationFn: reject401 }).execute(undefined).catch(() => undefined);
    expect(endedSessions).toBe(1);
  });
});
