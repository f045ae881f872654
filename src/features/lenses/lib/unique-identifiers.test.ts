import { describe, expect, it } from 'vitest';
import { uniqueIdentifiers } from '@/features/lenses/lib/unique-identifiers';

describe('uniqueIdentifiers', () => {
  it('uniqueIdentifiers numbers repeats from the second one and leaves unique identifiers alone', () => {
    expect(uniqueIdentifiers(['L-01', 'L-02', 'L-01', 'L-01'])).toEqual(['L-01', 'L-02', 'L-01 (2)', 'L-01 (3)']);
  });

  it('uniqueIdentifiers never produces a label that is already someone’s identifier', () => {
    const labels = uniqueIdentifiers(['L-01', 'L-01 (2)', 'L-01']);
    expect(new Set(labels).size).toBe(3);
    expect(labels[0]).toBe('L-01');
    expect(labels[1]).toBe('L-01 (2)');
  });
});
