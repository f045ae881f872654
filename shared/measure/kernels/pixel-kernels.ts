import type { GreyImage, PixelRect } from '../types';
import { PIXEL_KERNELS_WASM_BASE64 } from './pixel-kernels-binary';

/**
 * The engine's two heaviest pixel loops in WebAssembly with SIMD (source:
 * ./assembly/pixel-kernels.ts): the gradient-energy sums of a frame's region
 * and the box reduction that confirms the target in it. In JavaScript they
 * took about half of the main thread's time per frame; here about a third
 * of that. Pixels are copied into the module's memory for each call (a
 * fraction of a millisecond for a region).
 */
interface KernelExports {
  memory: WebAssembly.Memory;
  gradientEnergySums(
    image: number,
    stride: number,
    x0: number,
    y0: number,
    w: number,
    h: number,
    shift: number,
    saturationLevel: number,
    out: number,
  ): void;
  downsample(image: number, width: number, factor: number, outWidth: number, outHeight: number, output: number, columns: number): void;
}

/** The first page is the module's own (it has no data, but its layout is the compiler's); results go at its end. */
const PAGE_BYTES = 65_536;
const RESULTS_AT = PAGE_BYTES - 64;
const IMAGE_AT = PAGE_BYTES;

let instance: KernelExports | null = null;

function kernels(): KernelExports {
  if (!instance) {
    const binary = Uint8Array.from(atob(PIXEL_KERNELS_WASM_BASE64), (c) => c.charCodeAt(0));
    const module = new WebAssembly.Module(binary);
    instance = new WebAssembly.Instance(module, {
      env: {
        abort: () => {
          throw new Error('pixel kernel aborted');
        },
      },
    }).exports as unknown as KernelExports;
  }
  return instance;
}

/** The module's memory with at least `bytes` bytes (grown in whole pages, never shrunk). */
function memoryOf(exports: KernelExports, bytes: number): ArrayBuffer {
  const have = exports.memory.buffer.byteLength;
  if (have < bytes) exports.memory.grow(Math.ceil((bytes - have) / PAGE_BYTES));
  return exports.memory.buffer;
}

/** Rows y0 … y0 + rows − 1 of the image, whole width, copied to IMAGE_AT. */
function copyRows(buffer: ArrayBuffer, image: GreyImage, y0: number, rows: number): void {
  new Float32Array(buffer, IMAGE_AT, rows * image.width).set(image.data.subarray(y0 * image.width, (y0 + rows) * image.width));
}

export interface GradientEnergySums {
  /** Σ (I − shift) over every pixel of the rectangle. */
  sumIntensity: number;
  /** Σ (Gx² + Gy²) over the rectangle's interior (3 × 3 Sobel kernels inside it). */
  sumGradientSq: number;
  /** Pixels of the rectangle at or above the saturation level. */
  saturatedCount: number;
}

/**
 * The sums gradient energy needs over `rect` (at least 3 × 3, inside the
 * image; the caller checks). `saturationLevel` Infinity counts nothing.
 */
export function gradientEnergySums(image: GreyImage, rect: PixelRect, shift: number, saturationLevel: number): GradientEnergySums {
  const k = kernels();
  const buffer = memoryOf(k, IMAGE_AT + rect.height * image.width * 4);
  copyRows(buffer, image, rect.y, rect.height);
  k.gradientEnergySums(IMAGE_AT, image.width, rect.x, 0, rect.width, rect.height, shift, saturationLevel, RESULTS_AT);
  const results = new Float64Array(k.memory.buffer, RESULTS_AT, 3);
  return { sumIntensity: results[0], sumGradientSq: results[1], saturatedCount: results[2] };
}

/**
 * Box-average reduction by a whole factor (see `downsampleImage`): the
 * outWidth × outHeight means of factor × factor blocks from the top left.
 */
export function boxReduce(image: GreyImage, factor: number, outWidth: number, outHeight: number): Float32Array {
  const k = kernels();
  const rows = outHeight * factor;
  const imageBytes = rows * image.width * 4;
  const outputAt = IMAGE_AT + imageBytes;
  const outputBytes = outWidth * outHeight * 4;
  const columnsAt = outputAt + Math.ceil(outputBytes / 8) * 8;
  const buffer = memoryOf(k, columnsAt + outWidth * factor * 8);
  copyRows(buffer, image, 0, rows);
  k.downsample(IMAGE_AT, image.width, factor, outWidth, outHeight, outputAt, columnsAt);
  return new Float32Array(k.memory.buffer, outputAt, outWidth * outHeight).slice();
}
