import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { binaryModuleText, compilePixelKernels, KERNELS_BINARY_MODULE } from './compile-pixel-kernels';

describe('committed pixel kernels', () => {
  it('are the WebAssembly the AssemblyScript source compiles to (run `npm run kernels` after changing it)', async () => {
    const binary = await compilePixelKernels();
    expect(readFileSync(KERNELS_BINARY_MODULE, 'utf8')).toBe(binaryModuleText(binary));
  }, 60_000);
});
