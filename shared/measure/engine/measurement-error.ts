/**
 * A problem with the user's input (manifest, files, or a method's
 * precondition). Its message is one sentence meant for the person who made
 * the measurement; it is printed without a stack trace.
 */
export class MeasurementError extends Error {
  readonly code: MeasurementErrorCode;
  constructor(code: MeasurementErrorCode, message: string) {
    super(message);
    this.name = 'MeasurementError';
    this.code = code;
  }
}

export type MeasurementErrorCode =
  | 'invalid-manifest'
  | 'missing-file'
  | 'too-few-frames'
  | 'target-not-found'
  | 'no-focus-peak'
  | 'method-precondition';

/** Thrown by a frame source when a listed file does not exist. */
export class FrameMissingError extends Error {
  readonly file: string;
  constructor(file: string) {
    super(`frame file not found: ${file}`);
    this.name = 'FrameMissingError';
    this.file = file;
  }
}

/** Thrown by a frame source when a file exists but cannot be decoded as an image. */
export class FrameUnreadableError extends Error {
  readonly file: string;
  constructor(file: string, detail: string) {
    super(`frame ${file} could not be decoded: ${detail}`);
    this.name = 'FrameUnreadableError';
    this.file = file;
  }
}

/** A programmer error: a broken assumption inside the engine, never a user's fault. */
export function invariant(condition: unknown, message: string): asserts condition {
  if (!condition) throw new Error(`invariant failed: ${message}`);
}
