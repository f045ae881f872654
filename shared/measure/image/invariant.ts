/** A broken invariant is a bug in the measurement code, never a user's mistake. */
export class MeasureInvariantError extends Error {
  constructor(message: string) {
    super(`Invariant failed: ${message}`);
    this.name = 'MeasureInvariantError';
  }
}

export function invariant(condition: unknown, message: string): asserts condition {
  if (!condition) throw new MeasureInvariantError(message);
}
