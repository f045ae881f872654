import { fileURLToPath } from 'node:url';

/** Absolute path of the repository root (the folder holding package.json). */
export const projectRoot = fileURLToPath(new URL('..', import.meta.url)).replace(/\/$/, '');
