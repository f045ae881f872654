/**
 * The values each kind of equipment carries (server/db/schema.ts,
 * `EquipmentValues`), described once so that the register's columns and the
 * add/edit form are drawn from the same list.
 */
import type { EquipmentKindName } from '@shared/schemas/equipment';

export interface NumberValueField {
  type: 'number';
  key: string;
  label: string;
  unit: string;
  required: boolean;
  /** Whole numbers only (pixel counts). */
  integer?: boolean;
  /** Sizes must be above zero; an uncertainty may be zero (the server accepts it), never negative. */
  minimum: 'positive' | 'non-negative';
  /** When set, this field is the standard uncertainty of that value field. */
  uncertaintyOf?: string;
  placeholder?: string;
}

export interface ChoiceValueField {
  type: 'choice';
  key: string;
  label: string;
  required: boolean;
  choices: { value: string; label: string }[];
}

export type ValueField = NumberValueField | ChoiceValueField;

export const EQUIPMENT_KIND_WORDS: Record<EquipmentKindName, { one: string; many: string; about: string }> = {
  camera: { one: 'Camera', many: 'Cameras', about: 'Sensors used bare on the rail; the pixel pitch turns image sizes into millimetres.' },
  target: { one: 'Target', many: 'Targets', about: 'Illuminated patterns of certified size, the object the lens images.' },
  'rail-scale': { one: 'Rail scale', many: 'Rail scales', about: 'The scales the carriers’ positions are read from.' },
  collimator: { one: 'Collimator', many: 'Collimators', about: 'Put the target at infinity for the collimator method.' },
  'auxiliary-lens': { one: 'Auxiliary lens', many: 'Auxiliary lenses', about: 'Known converging lenses paired with a diverging lens under test.' },
};

export const EQUIPMENT_VALUE_FIELDS: Record<EquipmentKindName, ValueField[]> = {
  camera: [
    { type: 'number', key: 'pixelPitchUm', label: 'Pixel pitch', unit: 'µm', required: true, minimum: 'positive', placeholder: '3.45' },
    { type: 'number', key: 'pixelPitchUncertaintyUm', label: 'Pixel pitch, u', unit: 'µm', required: true, minimum: 'non-negative', uncertaintyOf: 'pixelPitchUm', placeholder: '0.005' },
    { type: 'number', key: 'widthPx', label: 'Width', unit: 'px', required: false, minimum: 'positive', integer: true, placeholder: '4096' },
    { type: 'number', key: 'heightPx', label: 'Height', unit: 'px', required: false, minimum: 'positive', integer: true, placeholder: '3000' },
  ],
  target: [
    {
      type: 'choice',
      key: 'pattern',
      label: 'Pattern',
      required: true,
      choices: [
        { value: 'dot-pair', label: 'Dot pair (centre spacing)' },
        { value: 'square', label: 'Square (edge length)' },
      ],
    },
    { type: 'number', key: 'sizeMm', label: 'Certified size', unit: 'mm', required: true, minimum: 'positive', placeholder: '10.000' },
    { type: 'number', key: 'sizeUncertaintyMm', label: 'Certified size, u', unit: 'mm', required: true, minimum: 'non-negative', uncertaintyOf: 'sizeMm', placeholder: '0.002' },
    {
      type: 'choice',
      key: 'polarity',
      label: 'Polarity',
      required: false,
      choices: [
        { value: 'dark-on-light', label: 'Dark on light' },
        { value: 'light-on-dark', label: 'Light on dark' },
      ],
    },
  ],
  'rail-scale': [
    { type: 'number', key: 'uncertaintyMm', label: 'Reading, u', unit: 'mm', required: true, minimum: 'non-negative', placeholder: '0.02' },
    { type: 'number', key: 'lengthMm', label: 'Length', unit: 'mm', required: false, minimum: 'positive', placeholder: '1500' },
  ],
  collimator: [
    { type: 'number', key: 'focalLengthMm', label: 'Focal length', unit: 'mm', required: true, minimum: 'positive', placeholder: '500' },
    { type: 'number', key: 'focalLengthUncertaintyMm', label: 'Focal length, u', unit: 'mm', required: true, minimum: 'non-negative', uncertaintyOf: 'focalLengthMm', placeholder: '0.5' },
  ],
  'auxiliary-lens': [
    { type: 'number', key: 'focalLengthMm', label: 'Focal length', unit: 'mm', required: true, minimum: 'positive', placeholder: '50' },
    { type: 'number', key: 'focalLengthUncertaintyMm', label: 'Focal length, u', unit: 'mm', required: true, minimum: 'non-negative', uncertaintyOf: 'focalLengthMm', placeholder: '0.05' },
  ],
};
