import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { numberCounters } from '../../../server/db/schema';
import { InvariantError } from '../../../server/invariant';
import { allocateNumber, formatRecordNumber } from '../../../server/services/numbering';
import { createTestApp, type TestApp } from '../../helpers/test-app';

let testApp: TestApp;

beforeAll(() => {
  testApp = createTestApp();
});

afterAll(async () => {
  await testApp?.close();
});

/** A year no other test file uses, so this file owns its counters. */
function privateYear(): number {
  return 2200 + Math.floor(Math.random() * 7000);
}

describe('formatRecordNumber', () => {
  it('pads the serial to four digits and lets it grow past 9999', () => {
    expect(formatRecordNumber('work-order', 2026, 1)).toBe('WO-2026-0001');
    expect(formatRecordNumber('measurement', 2026, 31)).toBe('M-2026-0031');
    expect(formatRecordNumber('certificate', 2027, 12345)).toBe('C-2027-12345');
  });
});

describe('allocateNumber', () => {
  it('starts each kind and year at 0001 and counts kinds separately', async () => {
    const year = privateYear();
    const { db } = testApp.deps;
    expect(await allocateNumber(db, 'work-order', year)).toBe(`WO-${year}-0001`);
    expect(await allocateNumber(db, 'work-order', year)).toBe(`WO-${year}-0002`);
    expect(await allocateNumber(db, 'measurement', year)).toBe(`M-${year}-0001`);
    expect(await allocateNumber(db, 'certificate', year)).toBe(`C-${year}-0001`);
    expect(await allocateNumber(db, 'work-order', year + 1)).toBe(`WO-${year + 1}-0001`);
  });

  it('gives 25 concurrent transactions 25 different, consecutive numbers', async () => {
    const year = privateYear();
    const { db } = testApp.deps;
    const numbers = await Promise.all(
      Array.from({ length: 25 }, () =>
        db.transaction(async (tx) => {
          const number = await allocateNumber(tx, 'measurement', year);
          // Hold the transaction open a little, as an insert after the allocation would.
          await tx.execute('select pg_sleep(0.01)');
          return number;
        }),
      ),
    );
    expect(new Set(numbers).size).toBe(25);
    expect([...numbers].sort()).toEqual(Array.from({ length: 25 }, (_, i) => `M-${year}-${String(i + 1).padStart(4, '0')}`));
  });

  it('hands a rolled-back number out again, so a failed insert leaves no gap', async () => {
    const year = privateYear();
    const { db } = testApp.deps;
    expect(await allocateNumber(db, 'certificate', year)).toBe(`C-${year}-0001`);
    await expect(
      db.transaction(async (tx) => {
        expect(await allocateNumber(tx, 'certificate', year)).toBe(`C-${year}-0002`);
        throw new Error('the insert after the allocation failed');
      }),
    ).rejects.toThrow('the insert after the allocation failed');
    expect(await allocateNumber(db, 'certificate', year)).toBe(`C-${year}-0002`);
    const [counter] = await db
      .select()
      .from(numberCounters)
      .where(and(eq(numberCounters.kind, 'certificate'), eq(numberCounters.year, year)));
    expect(counter.lastValue).toBe(2);
  });

  it('treats an impossible year as a bug', async () => {
    await expect(allocateNumber(testApp.deps.db, 'work-order', 26)).rejects.toThrow(InvariantError);
  });
});
