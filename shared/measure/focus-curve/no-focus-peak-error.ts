/** A through-focus curve has no peak that can be located inside the sweep (a user-facing condition, not a bug). */
export class NoFocusPeakError extends Error {
  constructor(reason: string) {
    super(`no focus peak inside the sweep: ${reason}`);
    this.name = 'NoFocusPeakError';
  }
}
