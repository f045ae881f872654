import { describe, expect, it } from 'vitest';
import { focalLengthFromPowerMm, lensKindOf, powerFromFocalLengthDioptres, toleranceBand } from '@/features/lenses/lib/lens-optics';

describe('power ↔ focal length', () => {
  it('a 100 mm lens has a power of +10 D, and a −4 D lens a focal length of −250 mm (P = 1/f′ in metres, textbook optics)', () => {
    expect(powerFromFocalLengthDioptres(100)).toBeCloseTo(10, 12);
    expect(focalLengthFromPowerMm(-4)).toBeCloseTo(-250, 12);
  });

  it('converting a focal length to power and back returns it to 1e-12 relative', () => {
    for (const focalLengthMm of [3.3, 49.8, -75, 1000, -12_500]) {
      const back = focalLengthFromPowerMm(powerFromFocalLengthDioptres(focalLengthMm));
      expect(Math.abs(back - focalLengthMm) / Math.abs(focalLengthMm)).toBeLessThan(1e-12);
    }
  });

  it('zero and non-finite inputs throw a sentence naming the option', () => {
    expect(() => powerFromFocalLengthDioptres(0)).toThrow('Option "focalLengthMm" must be a finite, non-zero number; got 0.');
    expect(() => focalLengthFromPowerMm(Number.NaN)).toThrow('Option "powerDioptres" must be a finite, non-zero number; got NaN.');
  });

  it('lensKindOf reads the kind from the sign of the focal length', () => {
    expect(lensKindOf(50)).toBe('converging');
    expect(lensKindOf(-50)).toBe('diverging');
  });
});

describe('toleranceBand', () => {
  it('± 1 % of a diverging −200 mm lens is ± 2 mm around −200 mm', () => {
    expect(toleranceBand({ nominalFocalLengthMm: -200, tolerancePercent: 1 })).toEqual({
      lowerLimitMm: -202,
      upperLimitMm: -198,
      halfWidthMm: 2,
      from: 'percent',
    });
  });

  it('with both tolerances recorded the narrower one sets the band', () => {
    expect(toleranceBand({ nominalFocalLengthMm: 100, tolerancePercent: 2, toleranceMm: 0.5 })).toMatchObject({ halfWidthMm: 0.5, from: 'mm' });
    expect(toleranceBand({ nominalFocalLengthMm: 100, tolerancePercent: 0.2, toleranceMm: 0.5 })).toMatchObject({ halfWidthMm: 0.2, from: 'percent' });
  });

  it('toleranceBand without any tolerance throws a sentence naming both options', () => {
    expect(() => toleranceBand({ nominalFocalLengthMm: 100 })).toThrow('Give at least one of the options "tolerancePercent" and "toleranceMm".');
    expect(() => toleranceBand({ nominalFocalLengthMm: 100, toleranceMm: -1 })).toThrow('Option "toleranceMm" must be a positive number; got -1.');
  });
});
