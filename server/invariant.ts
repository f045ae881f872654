/** A broken invariant is a bug in Paraxia, never a user's mistake. */
export class InvariantError extends Error {
  constructor(message: string) {
    super(`Invariant failed: ${message}`);
    this.name = 'InvariantError';
  }
}

export function invariant(condition: unknown, message: string): asserts condition {
  if (!condition) throw new InvariantError(message);
}
