import { describe, expect, it } from 'vitest';
import { plural } from '@/features/admin-storage/lib/plural';

describe('plural', () => {
  it('uses the singular for exactly one and the plural otherwise, including zero', () => {
    expect(plural(1, 'object')).toBe('object');
    expect(plural(0, 'object')).toBe('objects');
    expect(plural(2, 'measurement')).toBe('measurements');
    expect(plural(3, 'key', 'keys')).toBe('keys');
  });
});
