import { FrameMissingError, FrameUnreadableError, MeasurementError } from './measurement-error';

export interface UnreadableFrame {
  rejected: string;
}

/** Reads a frame through the source, turning a decode failure into a rejection and a missing file into a user error. */
export async function readOrReject<T>(file: string, read: () => Promise<T>): Promise<T | UnreadableFrame> {
  try {
    return await read();
  } catch (error) {
    if (error instanceof FrameMissingError) {
      throw new MeasurementError('missing-file', `frame file not found: ${file}`);
    }
    if (error instanceof FrameUnreadableError) return { rejected: error.message };
    throw error;
  }
}

export function isUnreadable<T>(value: T | UnreadableFrame): value is UnreadableFrame {
  return typeof value === 'object' && value !== null && 'rejected' in value;
}
