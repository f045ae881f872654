import { describe, expect, it } from 'vitest';
import { engineToleranceOf } from '../engine-manifest';
import { analysedLensSpecificationDifference } from './analysed-lens-specification';

const stored = (lens: Record<string, unknown>) => ({ manifest: { lens } });

describe('engineToleranceOf and analysedLensSpecificationDifference', () => {
  it('give the engine the tighter band when a lens carries a tolerance in % and in mm', () => {
    // 100 mm ± 2 % is ± 2 mm; ± 1.5 mm is tighter.
    expect(engineToleranceOf({ nominalFocalLengthMm: 100, tolerancePercent: 2, toleranceMm: 1.5 })).toEqual({ toleranceMm: 1.5 });
    // -50 mm ± 1 % is ± 0.5 mm; tighter than ± 0.8 mm.
    expect(engineToleranceOf({ nominalFocalLengthMm: -50, tolerancePercent: 1, toleranceMm: 0.8 })).toEqual({ tolerancePercent: 1 });
    expect(engineToleranceOf({ nominalFocalLengthMm: 100, tolerancePercent: null, toleranceMm: 0.3 })).toEqual({ toleranceMm: 0.3 });
  });

  it('treat an analysis that applied the tighter of two tolerances as matching the lens, and a changed band as not', () => {
    const lens = { nominalFocalLengthMm: 100, tolerancePercent: 2, toleranceMm: 1.5 };
    expect(analysedLensSpecificationDifference(stored({ nominalFocalLengthMm: 100, toleranceMm: 1.5, decisionRule: 'simple' }), lens, 'simple')).toBeNull();
    expect(analysedLensSpecificationDifference(stored({ nominalFocalLengthMm: 100, tolerancePercent: 2, decisionRule: 'simple' }), lens, 'simple')).toBe('specification');
    expect(analysedLensSpecificationDifference(stored({ nominalFocalLengthMm: 100, toleranceMm: 1.5, decisionRule: 'simple' }), lens, 'guarded')).toBe('decision-rule');
    expect(analysedLensSpecificationDifference({ manifest: {} }, lens, 'simple')).toBe('no-lens-in-analysis');
  });
});
