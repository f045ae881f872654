/** Quantile (0..1) of already sorted values, linear between order statistics. */
export function quantileOfSorted(sorted: ArrayLike<number>, probability: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const position = probability * (n - 1);
  const below = Math.floor(position);
  const above = Math.min(below + 1, n - 1);
  return sorted[below] + (position - below) * (sorted[above] - sorted[below]);
}

/** Median of the values (copies, then sorts the copy). */
export function median(values: ArrayLike<number>): number {
  const sorted = Float64Array.from(values).sort();
  return quantileOfSorted(sorted, 0.5);
}

/** Median absolute deviation from the median, scaled by 1.4826 to estimate a normal standard deviation. */
export function robustStdDev(values: ArrayLike<number>): number {
  const centre = median(values);
  const deviations = new Float64Array(values.length);
  for (let k = 0; k < values.length; k++) deviations[k] = Math.abs(values[k] - centre);
  return 1.4826 * quantileOfSorted(deviations.sort(), 0.5);
}
