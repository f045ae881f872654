import { quantileInPlace } from '../statistics/select-in-place';

/** Quantile (0..1) of already sorted values, linear between order statistics. */
export function quantileOfSorted(sorted: ArrayLike<number>, probability: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const position = probability * (n - 1);
  const below = Math.floor(position);
  const above = Math.min(below + 1, n - 1);
  return sorted[below] + (position - below) * (sorted[above] - sorted[below]);
}

/** Median of the values (the input is left as it is). */
export function median(values: ArrayLike<number>): number {
  return quantileInPlace(Float64Array.from(values), 0.5);
}

/** Median absolute deviation from the median, scaled by 1.4826 to estimate a normal standard deviation. */
export function robustStdDev(values: ArrayLike<number>): number {
  const deviations = Float64Array.from(values);
  return robustStdDevInPlace(deviations, deviations.length);
}

/** `robustStdDev` of `values[0..count)`, using the array as scratch space (its contents are overwritten). */
export function robustStdDevInPlace(values: Float64Array, count: number): number {
  if (count === 0) return NaN;
  const centre = quantileInPlace(values, 0.5, count);
  for (let k = 0; k < count; k++) values[k] = Math.abs(values[k] - centre);
  return 1.4826 * quantileInPlace(values, 0.5, count);
}
