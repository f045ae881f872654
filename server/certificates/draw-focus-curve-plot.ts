/**
 * A focus curve drawn as vectors: faint grid, axes with ticks and units, the
 * measured points, the fitted model and the best-focus marker (the only thing
 * in the focus colour) with its ±u band.
 */
import { scaleLinear } from 'd3-scale';
import type { CertificateData } from './certificate-data';
import { formatAtDecimals, formatMeasuredValue, formatSignificant } from './certificate-numbers';
import { ink, quantity, seg, styles, type Typesetter } from './certificate-typesetter';

/** One peak's points, fitted model and best focus (a displacement sweep is drawn as two of these). */
export type FocusCurvePlotData = Omit<CertificateData['results']['sweeps'][number]['focusCurve'], 'secondPeak'>;

export interface DrawFocusCurvePlotOptions {
  /** Outer box of the plot, labels included, in points. */
  x: number;
  y: number;
  width: number;
  height: number;
  title: string;
  curve: FocusCurvePlotData;
  /** Smaller type and fewer ticks for small multiples. */
  compact?: boolean;
}

const tickStyle = { family: 'mono', weight: 400, size: 6.6, color: ink.muted } as const;

export function drawFocusCurvePlot(typesetter: Typesetter, options: DrawFocusCurvePlotOptions): void {
  const { doc } = typesetter;
  const { x, y, width, height, title, curve, compact = false } = options;
  const peak = { positionMm: curve.bestFocusPositionMm, uMm: curve.bestFocusStandardUncertaintyMm, model: curve.curve };

  const left = x + (compact ? 34 : 40);
  const right = x + width - 14;
  const top = y + (compact ? 27 : 16);
  const bottom = y + height - (compact ? 26 : 28);

  const allPositions = [...curve.positionsMm, peak.positionMm, ...peak.model.map((c) => c.positionMm)];
  const allValues = [...curve.focusValues, ...peak.model.map((c) => c.value)];
  const xLow = Math.min(...allPositions);
  const xHigh = Math.max(...allPositions);
  const xPad = 0.03 * (xHigh - xLow || 1);
  const xScale = scaleLinear()
    .domain([xLow - xPad, xHigh + xPad])
    .range([left, right]);
  const yMax = Math.max(...allValues);
  const yMin = Math.min(0, ...allValues);
  const yScale = scaleLinear()
    .domain([yMin, yMax + 0.08 * (yMax - yMin || 1)])
    .range([bottom, top])
    .nice(compact ? 4 : 5);

  const xTicks = xScale.ticks(compact ? 5 : 9);
  const yTicks = yScale.ticks(compact ? 4 : 5);

  typesetter.line([seg(title, { ...styles.bodyStrong, size: compact ? 7.8 : 8.4 })], x, y + 8);

  doc.save();
  doc.lineWidth(0.35).strokeColor(ink.grid);
  for (const t of xTicks) doc.moveTo(xScale(t), top).lineTo(xScale(t), bottom).stroke();
  for (const t of yTicks) doc.moveTo(left, yScale(t)).lineTo(right, yScale(t)).stroke();
  doc.restore();

  // ±u band and marker first, so the points and the model stay visible over them.
  const px = xScale(peak.positionMm);
  const halfBand = Math.max(xScale(peak.positionMm + peak.uMm) - px, 0.6);
  doc.save().rect(px - halfBand, top, 2 * halfBand, bottom - top).fillOpacity(0.13).fill(ink.focus).restore();
  doc.save().moveTo(px, top).lineTo(px, bottom).lineWidth(1.1).strokeColor(ink.focus).stroke().restore();
  doc.save().polygon([px - 3.2, top - 5], [px + 3.2, top - 5], [px, top]).fill(ink.focus).restore();

  doc.save().lineWidth(0.9).strokeColor(ink.text).lineJoin('round');
  peak.model.forEach((point, i) => {
    if (i === 0) doc.moveTo(xScale(point.positionMm), yScale(point.value));
    else doc.lineTo(xScale(point.positionMm), yScale(point.value));
  });
  doc.stroke().restore();

  doc.save().lineWidth(0.6).strokeColor(ink.text).fillColor('#FFFFFF');
  curve.positionsMm.forEach((position, i) => {
    doc.circle(xScale(position), yScale(curve.focusValues[i]), compact ? 1.5 : 1.9).fillAndStroke('#FFFFFF', ink.text);
  });
  doc.restore();

  doc.save().lineWidth(0.7).strokeColor(ink.text);
  doc.moveTo(left, top).lineTo(left, bottom).lineTo(right, bottom).stroke();
  for (const t of xTicks) doc.moveTo(xScale(t), bottom).lineTo(xScale(t), bottom + 3).stroke();
  for (const t of yTicks) doc.moveTo(left - 3, yScale(t)).lineTo(left, yScale(t)).stroke();
  doc.restore();

  for (const t of xTicks) {
    typesetter.line([seg(formatAtDecimals(t, tickDecimals(xTicks)), tickStyle)], xScale(t) - 20, bottom + 10.5, { width: 40, align: 'center' });
  }
  for (const t of yTicks) {
    typesetter.line([seg(formatAtDecimals(t, tickDecimals(yTicks)), tickStyle)], x, yScale(t) + 2.3, { width: left - x - 5, align: 'right' });
  }
  typesetter.line([seg('Rail position (mm)', styles.small)], left, bottom + 21, { width: right - left, align: 'center' });
  doc.save();
  doc.rotate(-90, { origin: [x + 6, (top + bottom) / 2] });
  typesetter.line([seg('Focus measure (normalised)', styles.small)], x + 6 - (bottom - top) / 2, (top + bottom) / 2 + 2.5, { width: bottom - top, align: 'center' });
  doc.restore();

  // Best-focus label beside the marker on whichever side has room; under the title when the plot is narrow.
  const positionText = peak.uMm > 0 ? formatMeasuredValue({ value: peak.positionMm, uncertainty: peak.uMm }).valueText : formatSignificant(peak.positionMm, 6);
  const label = [
    seg('best focus ', { ...styles.small, color: ink.focus }),
    ...quantity(positionText, 'mm', { ...tickStyle, color: ink.focus, size: 7 }, { ...styles.small, color: ink.focus }),
  ];
  if (compact) {
    typesetter.line(label, x, y + 19);
  } else {
    const labelWidth = typesetter.widthOf(label);
    typesetter.line(label, px + 6 + labelWidth < right ? px + 5 : px - 5 - labelWidth, top + 8);
  }

  if (!compact) drawLegend(typesetter, right, y + 8);
}

/** Key to the symbols, right-aligned so its last word ends at `right`. */
function drawLegend(typesetter: Typesetter, right: number, baselineY: number): void {
  const { doc } = typesetter;
  const labels = ['measured frames', 'fitted model', 'best focus ± u'].map((t) => [seg(t, styles.small)]);
  const symbolWidths = [9, 15, 9];
  const gap = 10;
  const total = labels.reduce((sum, label, i) => sum + symbolWidths[i] + typesetter.widthOf(label), 0) + gap * (labels.length - 1);
  let lx = right - total;
  const mid = baselineY - 2.5;
  doc.save().lineWidth(0.6).circle(lx + 3, mid, 1.9).fillAndStroke('#FFFFFF', ink.text).restore();
  lx += symbolWidths[0];
  lx += typesetter.line(labels[0], lx, baselineY) + gap;
  doc.save().lineWidth(0.9).strokeColor(ink.text).moveTo(lx, mid).lineTo(lx + 12, mid).stroke().restore();
  lx += symbolWidths[1];
  lx += typesetter.line(labels[1], lx, baselineY) + gap;
  doc.save().rect(lx, mid - 4.5, 6, 9).fillOpacity(0.13).fill(ink.focus).restore();
  doc.save().moveTo(lx + 3, mid - 4.5).lineTo(lx + 3, mid + 4.5).lineWidth(1.1).strokeColor(ink.focus).stroke().restore();
  lx += symbolWidths[2];
  typesetter.line(labels[2], lx, baselineY);
}

/** Decimals that show every tick of a d3 1-2-5 sequence exactly and alike. */
function tickDecimals(ticks: number[]): number {
  if (ticks.length < 2) return 0;
  return Math.max(0, -Math.floor(Math.log10(ticks[1] - ticks[0]) + 1e-9));
}
