/** Latency figures of a load run, from every response time recorded (ms). */
export interface LatencySummary {
  requests: number;
  p50Ms: number;
  p95Ms: number;
  p99Ms: number;
  maxMs: number;
}

/** The nearest-rank percentile (the smallest value with at least p % of values at or below it), as in NIST's Engineering Statistics Handbook §7.2.6.2, method 1. */
export function percentileNearestRank(sortedMs: readonly number[], percent: number): number {
  if (sortedMs.length === 0) return Number.NaN;
  if (!(percent > 0 && percent <= 100)) throw new RangeError(`percent must be in (0, 100], got ${percent}.`);
  const rank = Math.ceil((percent / 100) * sortedMs.length);
  return sortedMs[rank - 1];
}

export function summariseLatencies(latenciesMs: readonly number[]): LatencySummary {
  const sorted = Float64Array.from(latenciesMs).sort();
  const values = Array.from(sorted);
  return {
    requests: values.length,
    p50Ms: percentileNearestRank(values, 50),
    p95Ms: percentileNearestRank(values, 95),
    p99Ms: percentileNearestRank(values, 99),
    maxMs: values.length > 0 ? values[values.length - 1] : Number.NaN,
  };
}
