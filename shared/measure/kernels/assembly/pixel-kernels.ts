// AssemblyScript, compiled to WebAssembly (with SIMD) by `npm run kernels`;
// the binary is committed as shared/measure/kernels/pixel-kernels-binary.ts.
// Not part of the TypeScript project (its types are AssemblyScript's).
//
// Images are float32 rows in linear memory. Every sum is kept in float64,
// two lanes at a time; each pixel's terms are computed in float64 with the
// same operations, in the same order, as the JavaScript reference in the
// tests, so only the order of summation differs (none at all for whole
// numbers: their sums are exact below 2^53).

/** The f64 pair (a[i], a[i + 1]) of float32 values at byte address `at`. */
// @ts-ignore: decorator
@inline
function pairAt(at: usize): v128 {
  return f64x2.promote_low_f32x4(v128.load64_zero(at));
}

/**
 * Sums for gradient energy over the rectangle (x0, y0, w, h) of an image
 * whose rows are `stride` floats apart, starting at `image`:
 *   out[0] = Σ (I − shift) over every pixel of the rectangle,
 *   out[1] = Σ (Gx² + Gy²) over its interior (3 × 3 Sobel),
 *   out[2] = number of pixels ≥ saturationLevel.
 * Gx = (t₊ + 2m₊ + b₊) − (t₋ + 2m₋ + b₋), Gy = (b₋ − t₋) + 2(b − t) + (b₊ − t₊)
 * for the rows above (t), at (m) and below (b) a pixel, columns − and +.
 * Needs w ≥ 3 and h ≥ 3.
 */
export function gradientEnergySums(
  image: usize,
  stride: i32,
  x0: i32,
  y0: i32,
  w: i32,
  h: i32,
  shift: f64,
  saturationLevel: f64,
  out: usize,
): void {
  const rowBytes = <usize>stride << 2;
  const first = image + (<usize>y0 * rowBytes) + (<usize>x0 << 2);
  const shiftPair = f64x2.splat(shift);
  const levelPair = f64x2.splat(saturationLevel);
  let intensity = f64x2.splat(0);
  let saturated = i64x2.splat(0);
  let pairs = w >> 1;
  for (let y = 0; y < h; y++) {
    const row = first + <usize>y * rowBytes;
    for (let i = 0; i < pairs; i++) {
      const v = pairAt(row + (<usize>i << 3));
      intensity = f64x2.add(intensity, f64x2.sub(v, shiftPair));
      // A true comparison is all ones (−1 as an integer), so subtracting counts it.
      saturated = i64x2.sub(saturated, f64x2.ge(v, levelPair));
    }
  }
  let sumIntensity: f64 = f64x2.extract_lane(intensity, 0) + f64x2.extract_lane(intensity, 1);
  let saturatedCount: f64 = <f64>(i64x2.extract_lane(saturated, 0) + i64x2.extract_lane(saturated, 1));
  if (w & 1) {
    for (let y = 0; y < h; y++) {
      const v = <f64>load<f32>(first + <usize>y * rowBytes + (<usize>(w - 1) << 2));
      sumIntensity += v - shift;
      if (v >= saturationLevel) saturatedCount += 1;
    }
  }

  let gradient = f64x2.splat(0);
  let tail: f64 = 0;
  const two = f64x2.splat(2);
  for (let y = 1; y < h - 1; y++) {
    const up = first + <usize>(y - 1) * rowBytes;
    const mid = up + rowBytes;
    const down = mid + rowBytes;
    // Pixels x and x + 1 per step (x from 1), from columns x − 1 … x + 2.
    let x = 1;
    for (; x + 2 < w; x += 2) {
      const left = <usize>(x - 1) << 2;
      const right = left + 8;
      const tLo = pairAt(up + left);
      const mLo = pairAt(mid + left);
      const bLo = pairAt(down + left);
      const tHi = pairAt(up + right);
      const mHi = pairAt(mid + right);
      const bHi = pairAt(down + right);
      // Column sums (t + 2m) + b and differences b − t at x − 1, x (Lo) and x + 1, x + 2 (Hi).
      const sLo = f64x2.add(f64x2.add(tLo, f64x2.mul(two, mLo)), bLo);
      const sHi = f64x2.add(f64x2.add(tHi, f64x2.mul(two, mHi)), bHi);
      const dLo = f64x2.sub(bLo, tLo);
      const dHi = f64x2.sub(bHi, tHi);
      const dMid = v128.shuffle<f64>(dLo, dHi, 1, 2);
      const gx = f64x2.sub(sHi, sLo);
      const gy = f64x2.add(f64x2.add(dLo, f64x2.mul(two, dMid)), dHi);
      gradient = f64x2.add(gradient, f64x2.add(f64x2.mul(gx, gx), f64x2.mul(gy, gy)));
    }
    for (; x < w - 1; x++) {
      const l = <usize>(x - 1) << 2;
      const c = l + 4;
      const r = l + 8;
      const t0 = <f64>load<f32>(up + l), t1 = <f64>load<f32>(up + c), t2 = <f64>load<f32>(up + r);
      const m0 = <f64>load<f32>(mid + l), m2 = <f64>load<f32>(mid + r);
      const b0 = <f64>load<f32>(down + l), b1 = <f64>load<f32>(down + c), b2 = <f64>load<f32>(down + r);
      const gx = (t2 + 2 * m2 + b2) - (t0 + 2 * m0 + b0);
      const gy = (b0 - t0) + 2 * (b1 - t1) + (b2 - t2);
      tail += gx * gx + gy * gy;
    }
  }
  store<f64>(out, sumIntensity);
  store<f64>(out, f64x2.extract_lane(gradient, 0) + f64x2.extract_lane(gradient, 1) + tail, 8);
  store<f64>(out, saturatedCount, 16);
}

/**
 * Box-average reduction by a whole `factor`: output pixel (i, j) is the mean
 * of the input block [i·factor, (i+1)·factor) × [j·factor, (j+1)·factor).
 * The input has `width` floats per row; the output is outWidth × outHeight
 * float32. `columns` is scratch space for outWidth·factor float64.
 */
export function downsample(image: usize, width: i32, factor: i32, outWidth: i32, outHeight: i32, output: usize, columns: usize): void {
  const used = outWidth * factor;
  const rowBytes = <usize>width << 2;
  const scale: f64 = 1.0 / (<f64>factor * <f64>factor);
  const pairs = used >> 1;
  for (let j = 0; j < outHeight; j++) {
    // Column sums over the block's rows, two columns at a time.
    memory.fill(columns, 0, <usize>used << 3);
    for (let dy = 0; dy < factor; dy++) {
      const row = image + <usize>(j * factor + dy) * rowBytes;
      for (let i = 0; i < pairs; i++) {
        const at = columns + (<usize>i << 4);
        v128.store(at, f64x2.add(v128.load(at), pairAt(row + (<usize>i << 3))));
      }
      if (used & 1) {
        const at = columns + (<usize>(used - 1) << 3);
        store<f64>(at, load<f64>(at) + <f64>load<f32>(row + (<usize>(used - 1) << 2)));
      }
    }
    const outRow = output + (<usize>(j * outWidth) << 2);
    for (let i = 0; i < outWidth; i++) {
      let sum: f64 = 0;
      const block = columns + (<usize>(i * factor) << 3);
      for (let dx = 0; dx < factor; dx++) sum += load<f64>(block + (<usize>dx << 3));
      store<f32>(outRow + (<usize>i << 2), <f32>(sum * scale));
    }
  }
}
