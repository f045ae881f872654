import { describe, expect, it } from 'vitest';
import { createEquipmentBody, updateEquipmentBody, type EquipmentItem } from '@shared/schemas/equipment';
import {
  createEquipmentRequest,
  emptyEquipmentDraft,
  equipmentDraftFrom,
  updateEquipmentRequest,
  type EquipmentDraft,
} from '@/features/equipment/lib/equipment-request';

const CAMERA: EquipmentItem = {
  id: 'c0ffee00-1234-4abc-8def-0123456789ab',
  kind: 'camera',
  identifier: 'CAM-03',
  description: 'Monochrome board camera, no lens',
  serialNumber: 'SN 44-1187',
  values: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.005, widthPx: 4096, heightPx: 3000 },
  calibrationReference: 'Report 2026-114, Larkspur in-house',
  calibrationDueDate: '2027-06-30',
  active: true,
  calibrationState: 'current',
  daysUntilCalibrationDue: 211,
};

describe('createEquipmentRequest', () => {
  it('createEquipmentRequest turns each kind’s typed values into numbers the server’s validator accepts', () => {
    const typed: EquipmentDraft[] = [
      { ...emptyEquipmentDraft('camera'), values: { pixelPitchUm: '3,45', pixelPitchUncertaintyUm: '0.005', widthPx: '4096', heightPx: '' } },
      { ...emptyEquipmentDraft('target'), values: { pattern: 'dot-pair', sizeMm: '10.000', sizeUncertaintyMm: '0.002', polarity: '' } },
      { ...emptyEquipmentDraft('rail-scale'), values: { uncertaintyMm: '0', lengthMm: '1500' } },
      { ...emptyEquipmentDraft('collimator'), values: { focalLengthMm: '500', focalLengthUncertaintyMm: '0.5' } },
      { ...emptyEquipmentDraft('auxiliary-lens'), values: { focalLengthMm: '50', focalLengthUncertaintyMm: '0.05' } },
    ];
    const drafts = typed.map((draft, index) => ({ ...draft, identifier: `EQ-${index}`, calibrationReference: 'Cert 7', calibrationDueDate: '2027-01-31' }));
    for (const draft of drafts) {
      const outcome = createEquipmentRequest(draft);
      expect(outcome.ok).toBe(true);
      if (outcome.ok) {
        const parsed = createEquipmentBody.safeParse(outcome.request);
        expect(parsed.success, `${draft.kind}: ${parsed.error?.message}`).toBe(true);
      }
    }
  });

  it('optional values left empty are not sent at all', () => {
    const outcome = createEquipmentRequest({
      ...emptyEquipmentDraft('camera'),
      identifier: 'CAM-9',
      values: { pixelPitchUm: '5.5', pixelPitchUncertaintyUm: '0.01', widthPx: '', heightPx: '' },
      calibrationReference: 'Cert 9',
      calibrationDueDate: '2027-01-31',
    });
    expect(outcome.ok && outcome.request.values).toEqual({ pixelPitchUm: 5.5, pixelPitchUncertaintyUm: 0.01 });
  });

  it('problems name the value as the server does (values.<name>) with a sentence', () => {
    const outcome = createEquipmentRequest({
      ...emptyEquipmentDraft('camera'),
      values: { pixelPitchUm: '0', pixelPitchUncertaintyUm: '', widthPx: '4096.5', heightPx: '' },
      calibrationDueDate: '2027-02-30',
    });
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) {
      expect(outcome.problems).toEqual({
        identifier: 'Give the lab’s identifier for this item, e.g. the asset tag.',
        calibrationReference: 'Give the calibration certificate or report this item’s values come from.',
        calibrationDueDate: 'Enter the calibration due date as a calendar date (YYYY-MM-DD).',
        'values.pixelPitchUm': 'The pixel pitch must be greater than zero.',
        'values.pixelPitchUncertaintyUm': 'Give the pixel pitch, u in µm.',
        'values.widthPx': 'The width is a whole number of px.',
      });
    }
  });

  it('an uncertainty as large as its value is caught as a slip of the digits', () => {
    const outcome = createEquipmentRequest({
      ...emptyEquipmentDraft('target'),
      identifier: 'TGT-1',
      values: { pattern: 'square', sizeMm: '2', sizeUncertaintyMm: '20', polarity: '' },
      calibrationReference: 'Cert',
      calibrationDueDate: '2027-01-31',
    });
    expect(outcome.ok === false && outcome.problems['values.sizeUncertaintyMm']).toMatch(/^An uncertainty as large as the value itself/);
  });
});

describe('updateEquipmentRequest', () => {
  it('an unchanged draft of an existing item sends nothing', () => {
    expect(updateEquipmentRequest(CAMERA, equipmentDraftFrom(CAMERA))).toEqual({ ok: true, request: {} });
  });

  it('changing one value sends the whole set of values, which the server checks together', () => {
    const draft = equipmentDraftFrom(CAMERA);
    draft.values.pixelPitchUncertaintyUm = '0.004';
    const outcome = updateEquipmentRequest(CAMERA, draft);
    expect(outcome).toEqual({
      ok: true,
      request: { values: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.004, widthPx: 4096, heightPx: 3000 } },
    });
    if (outcome.ok) expect(updateEquipmentBody.safeParse(outcome.request).success).toBe(true);
  });

  it('clearing the serial number sends null; a new due date is sent as typed', () => {
    const draft = { ...equipmentDraftFrom(CAMERA), serialNumber: '  ', calibrationDueDate: '2028-06-30' };
    expect(updateEquipmentRequest(CAMERA, draft)).toEqual({ ok: true, request: { serialNumber: null, calibrationDueDate: '2028-06-30' } });
  });
});
