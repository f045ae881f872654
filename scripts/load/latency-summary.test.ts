import { describe, expect, it } from 'vitest';
import { percentileNearestRank, summariseLatencies } from './latency-summary';

describe('percentileNearestRank', () => {
  // The worked example of the nearest-rank method (Wikipedia, "Percentile", nearest-rank method): 15, 20, 35, 40, 50.
  it('gives 15 for the 5th, 20 for the 30th and 40th, 35 for the 50th and 50 for the 100th percentile of 15, 20, 35, 40, 50', () => {
    const values = [15, 20, 35, 40, 50];
    expect(percentileNearestRank(values, 5)).toBe(15);
    expect(percentileNearestRank(values, 30)).toBe(20);
    expect(percentileNearestRank(values, 40)).toBe(20);
    expect(percentileNearestRank(values, 50)).toBe(35);
    expect(percentileNearestRank(values, 100)).toBe(50);
  });

  it('refuses a percentile outside (0, 100]', () => {
    expect(() => percentileNearestRank([1], 0)).toThrow('percent must be in (0, 100], got 0.');
  });
});

describe('summariseLatencies', () => {
  it('puts p95 of 1…100 ms at 95 ms and p99 at 99 ms, whatever the order recorded', () => {
    const shuffled = Array.from({ length: 100 }, (_, i) => ((i * 37) % 100) + 1);
    expect(summariseLatencies(shuffled)).toEqual({ requests: 100, p50Ms: 50, p95Ms: 95, p99Ms: 99, maxMs: 100 });
  });
});
