import type { ScaleLinear } from 'd3-scale';

export interface AxisTick {
  positionPx: number;
  label: string;
}

/**
 * Ticks of a linear scale at d3's "nice" steps, labelled with d3's matching
 * format (which prints a true minus sign).
 */
export function linearAxisTicks(scale: ScaleLinear<number, number>, count: number): AxisTick[] {
  const format = scale.tickFormat(count);
  return scale.ticks(count).map((value) => ({ positionPx: scale(value), label: format(value) }));
}

/**
 * Ticks for a second unit on the same pixel range (e.g. px on the left, mm on
 * the right): `toSecondUnit` converts a value of the scale's domain, and the
 * ticks fall at nice values of the second unit.
 */
export function convertedAxisTicks(
  scale: ScaleLinear<number, number>,
  toSecondUnit: (value: number) => number,
  count: number,
): AxisTick[] {
  const [d0, d1] = scale.domain();
  const [r0, r1] = scale.range();
  const converted = scale.copy().domain([toSecondUnit(d0), toSecondUnit(d1)]).range([r0, r1]);
  return linearAxisTicks(converted, count);
}
