/**
 * The k-th smallest (0-based) of `values[0..count)`, found by Hoare's
 * selection (expected linear time). Reorders that part of the array:
 * afterwards nothing before index k is larger and nothing after it is
 * smaller. Values must not be NaN.
 *
 * The pivot is Tukey's ninther (the median of three medians of three spread
 * samples): a plain median of first, middle and last degrades to quadratic
 * time on the V-shaped order that absolute deviations from a median leave.
 */
export function selectInPlace(values: Float64Array, k: number, count: number = values.length): number {
  let left = 0;
  let right = count - 1;
  while (right > left) {
    const pivot = pivotValue(values, left, right);
    let i = left;
    let j = right;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        swap(values, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else break;
  }
  return values[k];
}

function medianOfThree(a: number, b: number, c: number): number {
  if (a < b) return b < c ? b : a < c ? c : a;
  return a < c ? a : b < c ? c : b;
}

function pivotValue(values: Float64Array, left: number, right: number): number {
  const span = right - left;
  const middle = left + (span >> 1);
  if (span < 40) return medianOfThree(values[left], values[middle], values[right]);
  const step = span >> 3;
  return medianOfThree(
    medianOfThree(values[left], values[left + step], values[left + 2 * step]),
    medianOfThree(values[middle - step], values[middle], values[middle + step]),
    medianOfThree(values[right - 2 * step], values[right - step], values[right]),
  );
}

function swap(values: Float64Array, a: number, b: number): void {
  const t = values[a];
  values[a] = values[b];
  values[b] = t;
}

/**
 * The same number as `quantileOfSorted` of the sorted values, without a full
 * sort: the two order statistics around the position are selected. Reorders
 * `values[0..count)`.
 */
export function quantileInPlace(values: Float64Array, probability: number, count: number = values.length): number {
  if (count === 0) return NaN;
  const position = probability * (count - 1);
  const below = Math.floor(position);
  const above = Math.min(below + 1, count - 1);
  const [lower, upper] = count >= BUCKET_SELECTION_MIN_COUNT ? orderStatisticPair(values, below, count) : selectedPair(values, below, count);
  return lower + (position - below) * ((above === below ? lower : upper) - lower);
}

/** The k-th and (k+1)-th smallest by Hoare's selection (the latter is the least value past k). */
function selectedPair(values: Float64Array, k: number, count: number): [number, number] {
  const lower = selectInPlace(values, k, count);
  let upper = k + 1 < count ? values[k + 1] : lower;
  for (let i = k + 2; i < count; i++) if (values[i] < upper) upper = values[i];
  return [lower, upper];
}

/** Below this many values one selection is as quick as counting into buckets. */
const BUCKET_SELECTION_MIN_COUNT = 2_000;
const BUCKET_COUNT = 1_024;

/**
 * The k-th and (k+1)-th smallest of `values[0..count)` by counting them into
 * equal-width buckets between the least and greatest value, then selecting
 * inside the one or two buckets that hold those ranks. The bucket of a value
 * never decreases as the value grows, so this is exact; it reads the values
 * three times where Hoare's selection, on the smooth or V-shaped orders that
 * residuals arrive in, reads them several times more.
 */
function orderStatisticPair(values: Float64Array, k: number, count: number): [number, number] {
  let least = Infinity;
  let greatest = -Infinity;
  for (let i = 0; i < count; i++) {
    const v = values[i];
    if (v < least) least = v;
    if (v > greatest) greatest = v;
  }
  if (!(greatest > least) || !Number.isFinite(greatest - least)) return selectedPair(values, k, count);
  const scale = (BUCKET_COUNT - 1) / (greatest - least);
  const counts = new Int32Array(BUCKET_COUNT);
  for (let i = 0; i < count; i++) counts[Math.floor((values[i] - least) * scale)]++;
  let bucket = 0;
  let before = 0;
  while (before + counts[bucket] <= k) before += counts[bucket++];
  // The (k+1)-th smallest is in the same bucket or in the next one that holds any value.
  let upperBucket = bucket;
  if (before + counts[bucket] === k + 1 && k + 1 < count) {
    upperBucket = bucket + 1;
    while (counts[upperBucket] === 0) upperBucket++;
  }
  // Gather both buckets' values to the front (values below them come first in rank, so the ranks shift by `before`).
  let gathered = 0;
  for (let i = 0; i < count; i++) {
    const v = values[i];
    const b = Math.floor((v - least) * scale);
    if (b === bucket || b === upperBucket) {
      values[i] = values[gathered];
      values[gathered++] = v;
    }
  }
  return selectedPair(values, k - before, gathered);
}
