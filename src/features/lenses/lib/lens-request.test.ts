import { describe, expect, it } from 'vitest';
import { createLensBody } from '@shared/schemas/lenses';
import { createLensRequest, EMPTY_LENS_DRAFT, parseDecimal, previewLensDraft, type LensDraft } from '@/features/lenses/lib/lens-request';

function draft(overrides: Partial<LensDraft>): LensDraft {
  return { ...EMPTY_LENS_DRAFT, ...overrides };
}

describe('parseDecimal', () => {
  it('parseDecimal reads a point or a comma as the decimal sign and the typographic minus as a minus', () => {
    expect(parseDecimal('49.8')).toBe(49.8);
    expect(parseDecimal(' 49,8 ')).toBe(49.8);
    expect(parseDecimal('\u2212250')).toBe(-250);
    expect(parseDecimal('+4')).toBe(4);
    expect(parseDecimal('.5')).toBe(0.5);
  });

  it('parseDecimal refuses text, exponents, thousands separators and empty input', () => {
    for (const text of ['', 'abc', '1e3', '1,000.5', '1.2.3', '--4', '4 mm']) expect(parseDecimal(text)).toBeNull();
  });
});

describe('createLensRequest', () => {
  it('a nominal typed as focal length goes as nominalFocalLengthMm only, with the tolerance in the chosen unit', () => {
    const outcome = createLensRequest(draft({ identifier: ' PCX-100-017 ', nominalText: '100', toleranceText: '1' }));
    expect(outcome).toEqual({ ok: true, request: { identifier: 'PCX-100-017', nominalFocalLengthMm: 100, tolerancePercent: 1 } });
  });

  it('a nominal typed as power goes as nominalPowerDioptres only, never both', () => {
    const outcome = createLensRequest(
      draft({ identifier: 'NEG-7', partNumber: 'BCV-250', nominalMode: 'power', nominalText: '−4', toleranceMode: 'mm', toleranceText: '2,5' }),
    );
    expect(outcome).toEqual({ ok: true, request: { identifier: 'NEG-7', partNumber: 'BCV-250', nominalPowerDioptres: -4, toleranceMm: 2.5 } });
  });

  it('every request it builds passes the server’s own validator (shared createLensBody)', () => {
    const drafts = [
      draft({ identifier: 'A', nominalText: '50', toleranceText: '0.5', description: 'plano-convex' }),
      draft({ identifier: 'B', nominalMode: 'power', nominalText: '-10', toleranceMode: 'mm', toleranceText: '1' }),
    ];
    for (const candidate of drafts) {
      const outcome = createLensRequest(candidate);
      expect(outcome.ok).toBe(true);
      if (outcome.ok) expect(createLensBody.safeParse(outcome.request).success).toBe(true);
    }
  });

  it('problems are keyed by the field of the chosen unit, as the server keys them', () => {
    const outcome = createLensRequest(draft({ nominalMode: 'power', nominalText: '0', toleranceMode: 'mm', toleranceText: 'wide' }));
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) {
      expect(Object.keys(outcome.problems).sort()).toEqual(['identifier', 'nominalPowerDioptres', 'toleranceMm']);
      expect(outcome.problems.nominalPowerDioptres).toBe('A lens with zero power has no focal length; check the nominal value.');
      expect(outcome.problems.toleranceMm).toBe('“wide” is not a number; write it like 1 or 0.5.');
    }
  });

  it('a tolerance of zero or above 100 % is refused with a sentence', () => {
    const zero = createLensRequest(draft({ identifier: 'x', nominalText: '100', toleranceText: '0' }));
    expect(zero.ok === false && zero.problems.tolerancePercent).toBe('The tolerance is a ± half-width and must be greater than zero.');
    const huge = createLensRequest(draft({ identifier: 'x', nominalText: '100', toleranceText: '150' }));
    expect(huge.ok === false && huge.problems.tolerancePercent).toBe('A tolerance of 150 % is wider than the lens itself; give at most 100 %.');
  });
});

describe('previewLensDraft', () => {
  it('previewLensDraft shows a −4 D entry as a diverging −250 mm lens with its band', () => {
    const preview = previewLensDraft(draft({ nominalMode: 'power', nominalText: '-4', toleranceText: '1' }));
    expect(preview?.kind).toBe('diverging');
    expect(preview?.focalLengthMm).toBeCloseTo(-250, 12);
    expect(preview?.powerDioptres).toBe(-4);
    expect(preview?.band?.lowerLimitMm).toBeCloseTo(-252.5, 12);
    expect(preview?.band?.upperLimitMm).toBeCloseTo(-247.5, 12);
  });

  it('previewLensDraft is null until the nominal parses, and has no band while the tolerance does not', () => {
    expect(previewLensDraft(draft({ nominalText: '' }))).toBeNull();
    expect(previewLensDraft(draft({ nominalText: '0' }))).toBeNull();
    expect(previewLensDraft(draft({ nominalText: '100', toleranceText: 'x' }))?.band).toBeNull();
  });
});
