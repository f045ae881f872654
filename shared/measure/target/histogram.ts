export interface HistogramOptions {
  binCount: number;
  /** Lower edge of the first bin; the smallest value when absent. */
  lowerValue?: number;
  /** Upper edge of the last bin; the largest value when absent. Values outside go to the end bins. */
  upperValue?: number;
}

export interface Histogram {
  counts: Float64Array;
  lowerValue: number;
  binWidth: number;
}

export function checkHistogramOptions(options: HistogramOptions): void {
  if (!Number.isInteger(options.binCount) || options.binCount < 2) {
    throw new RangeError(`binCount must be a whole number of at least 2 (got ${options.binCount}).`);
  }
  for (const name of ['lowerValue', 'upperValue'] as const) {
    const value = options[name];
    if (value !== undefined && !Number.isFinite(value)) {
      throw new RangeError(`${name} must be a finite number (got ${value}).`);
    }
  }
}

/** Counts of `values` in `binCount` equal bins; bin k covers [lower + k·w, lower + (k+1)·w). */
export function histogram(values: ArrayLike<number>, options: HistogramOptions): Histogram {
  checkHistogramOptions(options);
  let lowerValue = options.lowerValue ?? Infinity;
  let upperValue = options.upperValue ?? -Infinity;
  if (options.lowerValue === undefined || options.upperValue === undefined) {
    for (let k = 0; k < values.length; k++) {
      const v = values[k];
      if (options.lowerValue === undefined && v < lowerValue) lowerValue = v;
      if (options.upperValue === undefined && v > upperValue) upperValue = v;
    }
  }
  const counts = new Float64Array(options.binCount);
  if (!(upperValue > lowerValue)) {
    if (values.length > 0) counts[0] = values.length;
    return { counts, lowerValue: Number.isFinite(lowerValue) ? lowerValue : 0, binWidth: 0 };
  }
  const binWidth = (upperValue - lowerValue) / options.binCount;
  // Built before the loop: code after a long loop that has never run deoptimises the loop's compiled form.
  const result: Histogram = { counts, lowerValue, binWidth };
  const last = options.binCount - 1;
  for (let k = 0; k < values.length; k++) {
    const bin = Math.floor((values[k] - lowerValue) / binWidth);
    counts[bin < 0 ? 0 : bin > last ? last : bin]++;
  }
  return result;
}
