/**
 * A caller passed an option the numerics cannot use. The message is one
 * sentence naming the option, fit to show to a user when the value came
 * from their manifest.
 */
export class InvalidOptionError extends RangeError {
  constructor(message: string) {
    super(message);
    this.name = 'InvalidOptionError';
  }
}
