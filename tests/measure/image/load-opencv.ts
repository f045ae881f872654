import { createRequire } from 'node:module';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type OpenCv = any;

/**
 * Loads @techstark/opencv-js (the reference library for the focus operators).
 * The module object is a thenable: returning it from an async function without
 * deleting `then` makes the await re-resolve it forever.
 */
export async function loadOpenCv(): Promise<OpenCv> {
  const cv = createRequire(import.meta.url)('@techstark/opencv-js');
  await new Promise<void>((resolve) => {
    if (cv.Mat) resolve();
    else cv.onRuntimeInitialized = () => resolve();
  });
  delete cv.then;
  return cv;
}
