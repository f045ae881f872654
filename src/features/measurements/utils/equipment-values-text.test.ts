import { describe, expect, it } from 'vitest';
import { equipmentValuesText } from '@/features/measurements/utils/equipment-values-text';

describe('equipmentValuesText', () => {
  it('equipmentValuesText prints each kind’s calibrated values with units and standard uncertainties', () => {
    expect(equipmentValuesText({ kind: 'camera', values: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.01, widthPx: 4000, heightPx: 3000 } })).toBe(
      'pixel pitch 3.45 µm (u = 0.01 µm) · 4000 × 3000 px',
    );
    expect(equipmentValuesText({ kind: 'target', values: { pattern: 'dot-pair', sizeMm: 6, sizeUncertaintyMm: 0.002, polarity: 'dark-on-light' } })).toBe(
      'dot pair, centres 6 mm (u = 0.002 mm) apart · dark on light',
    );
    expect(equipmentValuesText({ kind: 'target', values: { pattern: 'square', sizeMm: 5, sizeUncertaintyMm: 0 } })).toBe('square, side 5 mm');
    expect(equipmentValuesText({ kind: 'rail-scale', values: { uncertaintyMm: 0.02, lengthMm: 1500 } })).toBe('reading u = 0.02 mm · 1500 mm long');
    expect(equipmentValuesText({ kind: 'collimator', values: { focalLengthMm: 400, focalLengthUncertaintyMm: 0.4 } })).toBe('f = 400 mm (u = 0.4 mm)');
  });
});
