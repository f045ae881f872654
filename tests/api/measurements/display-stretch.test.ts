import { describe, expect, it } from 'vitest';
import { stretchForDisplay } from '../../../server/services/frame-images';

describe('stretchForDisplay', () => {
  it('maps a 12-bit range inside 16-bit samples linearly onto 0–255', () => {
    const samples = Uint16Array.from({ length: 2000 }, (_, i) => 500 + i);
    const levels = stretchForDisplay(samples);
    // 0.1 % of 2000 samples (2) may clip at each end; the rest follow the line through (502, 0) and (2497, 255).
    expect(levels[0]).toBe(0);
    expect(levels[1999]).toBe(255);
    expect(levels[1000]).toBe(Math.round(((1500 - 502) * 255) / (2497 - 502)));
    for (let i = 1; i < levels.length; i++) expect(levels[i]).toBeGreaterThanOrEqual(levels[i - 1]);
  });

  it('does not let one hot pixel set the white level', () => {
    const samples = Uint16Array.from({ length: 5000 }, (_, i) => 1000 + (i % 100));
    samples[1234] = 65535;
    const levels = stretchForDisplay(samples);
    expect(levels[99]).toBe(255);
    expect(levels[1234]).toBe(255);
    expect(levels[0]).toBe(0);
  });

  it('shows a flat frame as black rather than dividing by zero', () => {
    expect([...stretchForDisplay(new Uint16Array([700, 700, 700]))]).toEqual([0, 0, 0]);
  });
});
