/**
 * An equipment item's calibrated values as one short line, with units, for
 * pickers and the measurement header: the numbers the analysis will use.
 */
import type { EquipmentItem } from '@shared/schemas/equipment';

function num(value: unknown): number | null {
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

/** A value and its standard uncertainty: "3.45 µm (u = 0.01 µm)". */
function withUncertainty(value: number, uncertainty: number | null, unit: string): string {
  const text = `${value} ${unit}`;
  return uncertainty !== null && uncertainty > 0 ? `${text} (u = ${uncertainty} ${unit})` : text;
}

export function equipmentValuesText(item: Pick<EquipmentItem, 'kind' | 'values'>): string {
  const v = item.values;
  const parts: string[] = [];
  switch (item.kind) {
    case 'camera': {
      const pitch = num(v.pixelPitchUm);
      if (pitch !== null) parts.push(`pixel pitch ${withUncertainty(pitch, num(v.pixelPitchUncertaintyUm), 'µm')}`);
      const width = num(v.widthPx);
      const height = num(v.heightPx);
      if (width !== null && height !== null) parts.push(`${width} × ${height} px`);
      break;
    }
    case 'target': {
      const pattern = v.pattern === 'square' ? 'square' : v.pattern === 'dot-pair' ? 'dot pair' : null;
      const size = num(v.sizeMm);
      if (pattern !== null && size !== null) {
        const sizeText = withUncertainty(size, num(v.sizeUncertaintyMm), 'mm');
        parts.push(pattern === 'square' ? `square, side ${sizeText}` : `dot pair, centres ${sizeText} apart`);
      }
      if (v.polarity === 'dark-on-light') parts.push('dark on light');
      if (v.polarity === 'light-on-dark') parts.push('light on dark');
      break;
    }
    case 'rail-scale': {
      const u = num(v.uncertaintyMm);
      if (u !== null) parts.push(`reading u = ${u} mm`);
      const length = num(v.lengthMm);
      if (length !== null) parts.push(`${length} mm long`);
      break;
    }
    case 'collimator':
    case 'auxiliary-lens': {
      const f = num(v.focalLengthMm);
      if (f !== null) parts.push(`f = ${withUncertainty(f, num(v.focalLengthUncertaintyMm), 'mm')}`);
      break;
    }
  }
  return parts.join(' · ');
}
