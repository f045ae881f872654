type NumericArray = Float64Array | Float32Array | Int32Array | Uint8Array;

/**
 * A scratch typed array kept between calls of one synchronous image
 * operation, so that each frame does not hand the garbage collector another
 * megabyte (JavaScript runs one call at a time, so no two calls share it at
 * once). Only for arrays that never leave the operation. The contents are
 * whatever the last call left: callers write every element before reading it.
 */
export class ReusableArray<T extends NumericArray> {
  private array: T | null = null;

  constructor(private readonly create: (length: number) => T) {}

  /** A view of exactly `length` elements. */
  take(length: number): T {
    if (!this.array || this.array.length < length) this.array = this.create(length);
    return this.array.subarray(0, length) as T;
  }
}
