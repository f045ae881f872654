import { describe, expect, it } from 'vitest';
import { checkMeasurementManifest } from '../../../shared/schemas/measurement-manifest';

const frames = Array.from({ length: 6 }, (_, i) => ({ file: `s1/${String(i + 1).padStart(4, '0')}.png`, positionMm: 447 + i * 0.25 }));

function valid() {
  return structuredClone({
    method: 'finite-conjugate',
    camera: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.01 },
    target: { pattern: 'dot-pair', sizeMm: 6, sizeUncertaintyMm: 0.002 },
    scale: { uncertaintyMm: 0.02 },
    sweeps: [{ moving: 'sensor', objectPositionMm: 0, lensPositionMm: 300, frames }],
  }) as Record<string, any>;
}

function messageFor(mutate: (m: Record<string, any>) => void): string {
  const m = valid();
  mutate(m);
  const checked = checkMeasurementManifest(m);
  if (checked.ok) throw new Error('expected the manifest to be refused');
  return checked.message;
}

describe('checkMeasurementManifest', () => {
  it('accepts the contract example and fills absent uncertainties with 0', () => {
    const m = valid();
    delete m.scale;
    const checked = checkMeasurementManifest(m);
    expect(checked.ok).toBe(true);
    if (checked.ok) expect(checked.manifest.scale.uncertaintyMm).toBe(0);
  });

  it('names the field of an unknown method', () => {
    expect(messageFor((m) => (m.method = 'guesswork'))).toMatch(/^invalid manifest: method: method must be one of finite-conjugate/);
  });

  it('names a negative pixel pitch by its path', () => {
    expect(messageFor((m) => (m.camera.pixelPitchUm = -3))).toBe('invalid manifest: camera.pixelPitchUm: pixelPitchUm must be greater than zero');
  });

  it('names a frame position that is not a number by its index', () => {
    expect(messageFor((m) => (m.sweeps[0].frames[3].positionMm = 'near'))).toBe(
      'invalid manifest: sweeps[0].frames[3].positionMm: positionMm must be a number',
    );
  });

  it('refuses a frame path that leaves the measurement folder', () => {
    expect(messageFor((m) => (m.sweeps[0].frames[0].file = '../../etc/passwd'))).toMatch(/sweeps\[0\]\.frames\[0\]\.file: file must be a path inside/);
  });

  it('refuses a file listed twice in a sweep', () => {
    expect(messageFor((m) => (m.sweeps[0].frames[2].file = m.sweeps[0].frames[1].file))).toMatch(/listed twice/);
  });

  it('requires the lens reading when the sensor moves', () => {
    expect(messageFor((m) => delete m.sweeps[0].lensPositionMm)).toBe(
      'invalid manifest: sweeps[0].lensPositionMm: lensPositionMm is required when the sensor moves',
    );
  });

  it('requires a collimator block for the collimator method', () => {
    expect(
      messageFor((m) => {
        m.method = 'collimator';
        delete m.sweeps[0].objectPositionMm;
      }),
    ).toBe('invalid manifest: collimator: collimator (focalLengthMm) is required for the collimator method');
  });

  it('requires two sweeps for the multi-conjugate method', () => {
    expect(messageFor((m) => (m.method = 'multi-conjugate'))).toMatch(/multi-conjugate method needs at least 2 sweeps/);
  });

  it('requires the lens to move for the displacement method', () => {
    expect(messageFor((m) => (m.method = 'displacement'))).toMatch(/sweeps\[0\]\.moving: moving must be "lens" for the displacement method/);
  });

  it('refuses a sweep of fewer than five frames', () => {
    expect(messageFor((m) => (m.sweeps[0].frames = m.sweeps[0].frames.slice(0, 3)))).toBe(
      'invalid manifest: sweeps[0].frames: frames must list at least 5 frames',
    );
  });
});
