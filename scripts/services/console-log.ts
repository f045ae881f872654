/** Plain human-readable lines for the start and test commands (stderr). */
export interface ServiceLog {
  step(message: string): void;
  warn(message: string): void;
  error(message: string): void;
}

export function createServiceLog(prefix = 'paraxia'): ServiceLog {
  return {
    step: (message) => process.stderr.write(`[${prefix}] ${message}\n`),
    warn: (message) => process.stderr.write(`[${prefix}] warning: ${message}\n`),
    error: (message) => process.stderr.write(`[${prefix}] error: ${message}\n`),
  };
}
