import { describe, expect, it } from 'vitest';
import type { EquipmentItem, EquipmentKindName as EquipmentKind } from '@shared/schemas/equipment';
import {
  buildCreateMeasurementRequest,
  emptyNewMeasurementDraft,
  sweepsForMethod,
  type NewMeasurementDraft,
} from '@/features/measurements/utils/build-create-measurement-request';
import { placeServerFieldErrors } from '@/features/measurements/utils/form-field-errors';
import { parseDecimal } from '@/features/measurements/utils/parse-decimal';

function item(id: string, kind: EquipmentKind, calibrationState: EquipmentItem['calibrationState'] = 'current'): EquipmentItem {
  return {
    id,
    kind,
    identifier: id.toUpperCase(),
    description: '',
    serialNumber: null,
    values: {},
    calibrationReference: `CAL-${id}`,
    calibrationDueDate: '2026-06-30',
    active: true,
    calibrationState,
    daysUntilCalibrationDue: calibrationState === 'overdue' ? -3 : 120,
  };
}

const equipment = [item('cam-1', 'camera'), item('tgt-1', 'target'), item('rail-1', 'rail-scale', 'overdue'), item('col-1', 'collimator')];
const equipmentById = new Map(equipment.map((e) => [e.id, e]));

function draftWith(change: Partial<NewMeasurementDraft>): NewMeasurementDraft {
  return {
    ...emptyNewMeasurementDraft('finite-conjugate'),
    equipmentIds: { camera: 'cam-1', target: 'tgt-1', 'rail-scale': 'rail-1' },
    overrideReasons: { 'rail-1': 'Recalibration booked for next week; scale checked against gauge blocks today.' },
    sweeps: [{ objectPositionMm: '0', lensPositionMm: '300,5', sensorPositionMm: '' }],
    ...change,
  };
}

describe('buildCreateMeasurementRequest', () => {
  it('buildCreateMeasurementRequest builds the POST body with overrides and only the readings the method needs', () => {
    const check = buildCreateMeasurementRequest({
      lensId: 'lens-1',
      nominalFocalLengthMm: 100,
      equipmentById,
      draft: draftWith({ temperatureC: '21.4', relativeHumidityPercent: '45', sweeps: [{ objectPositionMm: '0', lensPositionMm: '300,5', sensorPositionMm: '999' }] }),
    });
    expect(check).toEqual({
      ok: true,
      request: {
        lensId: 'lens-1',
        method: 'finite-conjugate',
        cameraId: 'cam-1',
        targetId: 'tgt-1',
        railScaleId: 'rail-1',
        overrides: [{ equipmentId: 'rail-1', reason: 'Recalibration booked for next week; scale checked against gauge blocks today.' }],
        temperatureC: 21.4,
        relativeHumidityPercent: 45,
        sweeps: [{ moving: 'sensor', objectPositionMm: 0, lensPositionMm: 300.5 }],
      },
    });
  });

  it('buildCreateMeasurementRequest names every field to fix: missing equipment, overdue without a reason, readings, order on the rail', () => {
    const check = buildCreateMeasurementRequest({
      lensId: 'lens-1',
      nominalFocalLengthMm: 100,
      equipmentById,
      draft: draftWith({
        method: 'collimator',
        overrideReasons: {},
        relativeHumidityPercent: '140',
        sweeps: [{ objectPositionMm: '', lensPositionMm: 'abc', sensorPositionMm: '' }],
      }),
    });
    expect(check.ok).toBe(false);
    if (check.ok) return;
    expect(check.fields).toEqual({
      collimatorId: 'Choose the collimator used on the bench.',
      'override.rail-scale': 'RAIL-1 was due for calibration on 2026-06-30; give the reason for using it anyway (at least a short sentence).',
      relativeHumidityPercent: 'Relative humidity must be between 0 % and 100 %.',
      'sweeps.0.lensPositionMm': 'The lens mark position of sweep 1 must be a number in mm, e.g. 250.0.',
    });

    const backwards = buildCreateMeasurementRequest({
      lensId: 'lens-1',
      nominalFocalLengthMm: 100,
      equipmentById,
      draft: draftWith({ sweeps: [{ objectPositionMm: '400', lensPositionMm: '300', sensorPositionMm: '' }] }),
    });
    expect(backwards.ok ? null : backwards.fields['sweeps.0.lensPositionMm']).toBe(
      'Sweep 1: the lens (300 mm) must sit after the object (400 mm); rail readings grow from object to sensor.',
    );
  });

  it('buildCreateMeasurementRequest applies the server’s shared method rules: distinct target distances, D > 4f, diverging lenses', () => {
    const multi = buildCreateMeasurementRequest({
      lensId: 'l',
      nominalFocalLengthMm: 100,
      equipmentById,
      draft: draftWith({
        method: 'multi-conjugate',
        sweeps: [
          { objectPositionMm: '0', lensPositionMm: '300', sensorPositionMm: '' },
          { objectPositionMm: '100', lensPositionMm: '400', sensorPositionMm: '' },
        ],
      }),
    });
    expect(multi.ok ? null : multi.fields['sweeps.1.objectPositionMm']).toMatch(/^Sweep 2 has the same object distance \(300 mm\) as sweep 1/);

    const shortBench = buildCreateMeasurementRequest({
      lensId: 'l',
      nominalFocalLengthMm: 100,
      equipmentById,
      draft: draftWith({ method: 'displacement', sweeps: [{ objectPositionMm: '0', lensPositionMm: '', sensorPositionMm: '380' }] }),
    });
    expect(shortBench.ok ? null : shortBench.fields['sweeps.0.sensorPositionMm']).toMatch(/must exceed 4 × the nominal focal length \(400 mm\)/);

    const longBench = buildCreateMeasurementRequest({
      lensId: 'l',
      nominalFocalLengthMm: 100,
      equipmentById,
      draft: draftWith({ method: 'displacement', sweeps: [{ objectPositionMm: '0', lensPositionMm: '', sensorPositionMm: '450' }] }),
    });
    expect(longBench.ok && longBench.request.sweeps).toEqual([{ moving: 'lens', objectPositionMm: 0, sensorPositionMm: 450 }]);

    const diverging = buildCreateMeasurementRequest({ lensId: 'l', nominalFocalLengthMm: -50, equipmentById, draft: draftWith({}) });
    expect(diverging.ok ? null : diverging.fields.method).toMatch(/measure it with the auxiliary-lens method/);
  });

  it('emptyNewMeasurementDraft starts a multi-conjugate measurement with two sweeps', () => {
    expect(emptyNewMeasurementDraft('multi-conjugate').sweeps).toHaveLength(2);
    expect(emptyNewMeasurementDraft('finite-conjugate').sweeps).toHaveLength(1);
  });
});

describe('sweepsForMethod', () => {
  it('sweepsForMethod adds sweeps up to the method minimum and drops only trailing empty ones when switching back', () => {
    const typed = { objectPositionMm: '0', lensPositionMm: '300', sensorPositionMm: '' };
    const empty = { objectPositionMm: '', lensPositionMm: '', sensorPositionMm: '' };
    expect(sweepsForMethod([typed], 'multi-conjugate')).toEqual([typed, empty]);
    expect(sweepsForMethod([typed, empty], 'finite-conjugate')).toEqual([typed]);
    expect(sweepsForMethod([typed, typed], 'finite-conjugate')).toEqual([typed, typed]);
    expect(sweepsForMethod([empty, typed, empty], 'finite-conjugate')).toEqual([empty, typed]);
  });
});

describe('placeServerFieldErrors', () => {
  it('placeServerFieldErrors puts bracketed and dotted server paths beside the same field and an override beside its item', () => {
    const request = {
      lensId: 'l',
      method: 'finite-conjugate' as const,
      cameraId: 'cam-1',
      targetId: 'tgt-1',
      railScaleId: 'rail-1',
      overrides: [{ equipmentId: 'rail-1', reason: 'short' }],
      sweeps: [{ moving: 'sensor' as const, objectPositionMm: 0, lensPositionMm: 300 }],
    };
    const placed = placeServerFieldErrors(
      {
        'sweeps[0].lensPositionMm': 'Lens position is beyond the rail.',
        'overrides.0.reason': 'Give a longer reason.',
        cameraId: 'This camera is retired.',
        focusOperator: 'Unknown focus operator.',
      },
      request,
      new Set(['sweeps.0.lensPositionMm', 'override.rail-scale', 'cameraId']),
    );
    expect(placed).toEqual({
      fields: {
        'sweeps.0.lensPositionMm': 'Lens position is beyond the rail.',
        'override.rail-scale': 'Give a longer reason.',
        cameraId: 'This camera is retired.',
      },
      unplaced: ['Unknown focus operator.'],
    });
  });
});

describe('parseDecimal', () => {
  it('parseDecimal reads points, a decimal comma and a true minus sign, and tells empty from wrong', () => {
    expect(parseDecimal(' 12.5 ')).toBe(12.5);
    expect(parseDecimal('12,5')).toBe(12.5);
    expect(parseDecimal('\u22123')).toBe(-3);
    expect(parseDecimal('')).toBeUndefined();
    expect(parseDecimal('1,000.5')).toBeNull();
    expect(parseDecimal('12mm')).toBeNull();
  });
});
