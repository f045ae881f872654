import type { BadFrameKind, BadFrameRequest } from './bench-scenario';

/**
 * Reads the command line's bad-frame list, "3:saturated,2/7:truncated":
 * [sweep/]frame:kind, sweep and frame numbers 1-based as in the file names.
 * The kind itself is checked with the rest of the scenario.
 */
export function parseBadFrames(text: string): BadFrameRequest[] {
  return text
    .split(',')
    .filter((part) => part.trim() !== '')
    .map((part) => {
      const match = /^\s*(?:(\d+)\/)?(\d+):([a-z-]+)\s*$/.exec(part);
      if (!match) throw new Error(`--bad: "${part}" is not [sweep/]frame:kind (e.g. 3:saturated or 2/7:truncated).`);
      return {
        ...(match[1] ? { sweepNumber: Number(match[1]) } : {}),
        frameNumber: Number(match[2]),
        kind: match[3] as BadFrameKind,
      };
    });
}
