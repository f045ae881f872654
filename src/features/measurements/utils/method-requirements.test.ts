import { describe, expect, it } from 'vitest';
import { measurementManifestSchema, measurementMethods } from '@shared/schemas/measurement-manifest';
import { methodRequirements, METHODS_IN_OFFER_ORDER, suggestedMethodFor } from '@/features/measurements/utils/method-requirements';

/** A manifest for the method built only from what methodRequirements says it needs. */
function manifestFromRequirements(method: (typeof measurementMethods)[number]) {
  const needs = methodRequirements(method);
  const fixed = { objectPositionMm: 0, lensPositionMm: 300, sensorPositionMm: 600 };
  return {
    method,
    camera: { pixelPitchUm: 3.45 },
    target: { pattern: 'dot-pair', sizeMm: 6 },
    ...(needs.equipmentRoles.includes('collimator') ? { collimator: { focalLengthMm: 400 } } : {}),
    ...(needs.equipmentRoles.includes('auxiliary-lens') ? { auxiliaryLens: { focalLengthMm: 75 } } : {}),
    sweeps: Array.from({ length: needs.minimumSweeps }, (_, i) => ({
      moving: needs.moving,
      ...Object.fromEntries(needs.sweepReadings.map((field) => [field, fixed[field] + i * 10])),
      frames: Array.from({ length: 5 }, (_, k) => ({ file: `s${i}/${k}.png`, positionMm: 400 + k })),
    })),
  };
}

describe('methodRequirements', () => {
  it('methodRequirements covers every method of the manifest contract and offers each once', () => {
    expect([...METHODS_IN_OFFER_ORDER].sort()).toEqual([...measurementMethods].sort());
  });

  it('methodRequirements asks for exactly what the manifest schema needs, per method', () => {
    for (const method of measurementMethods) {
      const manifest = manifestFromRequirements(method);
      const parsed = measurementManifestSchema.safeParse(manifest);
      expect(parsed.success, `${method}: ${parsed.success ? '' : parsed.error.issues.map((i) => i.message).join('; ')}`).toBe(true);
    }
  });

  it('methodRequirements: one sweep fewer than the minimum, or the wrong moving part, is refused by the manifest schema', () => {
    const multi = manifestFromRequirements('multi-conjugate');
    expect(measurementManifestSchema.safeParse({ ...multi, sweeps: multi.sweeps.slice(0, 1) }).success).toBe(false);
    const displacement = manifestFromRequirements('displacement');
    const wrongMoving = { ...displacement, sweeps: displacement.sweeps.map((s) => ({ ...s, moving: 'sensor' })) };
    expect(measurementManifestSchema.safeParse(wrongMoving).success).toBe(false);
  });

  it('methodRequirements maps each method to its equipment, moving part and fixed readings', () => {
    expect(methodRequirements('finite-conjugate')).toMatchObject({
      equipmentRoles: ['camera', 'target', 'rail-scale'],
      moving: 'sensor',
      minimumSweeps: 1,
      sweepReadings: ['objectPositionMm', 'lensPositionMm'],
    });
    expect(methodRequirements('multi-conjugate').minimumSweeps).toBe(2);
    expect(methodRequirements('displacement')).toMatchObject({ moving: 'lens', sweepReadings: ['objectPositionMm', 'sensorPositionMm'] });
    expect(methodRequirements('collimator')).toMatchObject({ equipmentRoles: ['camera', 'target', 'rail-scale', 'collimator'], sweepReadings: ['lensPositionMm'] });
    expect(methodRequirements('auxiliary-lens').equipmentRoles).toContain('auxiliary-lens');
    expect(suggestedMethodFor('diverging')).toBe('auxiliary-lens');
    expect(suggestedMethodFor('converging')).toBe('finite-conjugate');
  });

  it('every method explanation is one sentence', () => {
    for (const method of measurementMethods) {
      const { explanation } = methodRequirements(method);
      expect(explanation.trim().endsWith('.')).toBe(true);
      expect(explanation.slice(0, -1)).not.toMatch(/\.\s/);
    }
  });
});
