/** Throws when a condition the code relies on does not hold: a bug, never a user error. */
export function invariant(condition: unknown, message: string): asserts condition {
  if (!condition) throw new Error(`Invariant failed: ${message}`);
}
