import { invariant } from '../image/invariant';

export interface OtsuThreshold {
  /** The last bin of the lower class: bins 0..thresholdBin are below, the rest above. */
  thresholdBin: number;
  /** Between-class variance at the threshold, in bin units squared. */
  betweenClassVariance: number;
  /** Between-class over total variance (Otsu's η), 0..1; near 1 for two well-separated modes. */
  separability: number;
  /** Share of the counts in the lower class. */
  lowerClassFraction: number;
}

/**
 * Otsu's threshold (N. Otsu, IEEE Trans. SMC 9 (1979) 62–66): the split of a
 * histogram that maximises the between-class variance ω₀ω₁(μ₀ − μ₁)². The first
 * of equal maxima wins. Returns null for a histogram with fewer than two
 * occupied bins (nothing to separate).
 */
export function otsuThreshold(counts: ArrayLike<number>): OtsuThreshold | null {
  const binCount = counts.length;
  let total = 0;
  let weightedTotal = 0;
  let occupied = 0;
  for (let k = 0; k < binCount; k++) {
    invariant(counts[k] >= 0, 'histogram counts must not be negative');
    total += counts[k];
    weightedTotal += k * counts[k];
    if (counts[k] > 0) occupied++;
  }
  if (occupied < 2) return null;
  const meanTotal = weightedTotal / total;
  let totalVariance = 0;
  for (let k = 0; k < binCount; k++) totalVariance += counts[k] * (k - meanTotal) ** 2;
  totalVariance /= total;

  let lowerCount = 0;
  let lowerWeighted = 0;
  let best = -1;
  let bestBin = -1;
  let bestLowerFraction = 0;
  for (let k = 0; k < binCount - 1; k++) {
    lowerCount += counts[k];
    lowerWeighted += k * counts[k];
    if (lowerCount === 0 || lowerCount === total) continue;
    const lowerFraction = lowerCount / total;
    const lowerMean = lowerWeighted / lowerCount;
    const upperMean = (weightedTotal - lowerWeighted) / (total - lowerCount);
    const between = lowerFraction * (1 - lowerFraction) * (lowerMean - upperMean) ** 2;
    if (between > best) {
      best = between;
      bestBin = k;
      bestLowerFraction = lowerFraction;
    }
  }
  invariant(bestBin >= 0, 'a histogram with two occupied bins has a threshold');
  return {
    thresholdBin: bestBin,
    betweenClassVariance: best,
    separability: totalVariance > 0 ? best / totalVariance : 0,
    lowerClassFraction: bestLowerFraction,
  };
}
