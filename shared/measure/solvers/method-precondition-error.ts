/** The bench geometry does not allow the chosen method (a user-facing condition, not a bug). */
export class MethodPreconditionError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'MethodPreconditionError';
  }
}
