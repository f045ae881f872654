export type LogLevel = 'debug' | 'info' | 'warn' | 'error' | 'silent';

export interface Logger {
  debug(message: string, details?: Record<string, unknown>): void;
  info(message: string, details?: Record<string, unknown>): void;
  warn(message: string, details?: Record<string, unknown>): void;
  error(message: string, details?: Record<string, unknown>): void;
}

const levelRank: Record<LogLevel, number> = { debug: 10, info: 20, warn: 30, error: 40, silent: 100 };

function serialise(details: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(details)) {
    out[key] = value instanceof Error ? { name: value.name, message: value.message, stack: value.stack } : value;
  }
  return out;
}

/** One JSON line per entry on stderr, so stdout stays free for command output. */
export function createLogger(options: { level: LogLevel; name?: string }): Logger {
  const threshold = levelRank[options.level];
  const write = (level: Exclude<LogLevel, 'silent'>, message: string, details?: Record<string, unknown>) => {
    if (levelRank[level] < threshold) return;
    const entry = { at: new Date().toISOString(), level, ...(options.name ? { name: options.name } : {}), message, ...(details ? serialise(details) : {}) };
    process.stderr.write(`${JSON.stringify(entry)}\n`);
  };
  return {
    debug: (message, details) => write('debug', message, details),
    info: (message, details) => write('info', message, details),
    warn: (message, details) => write('warn', message, details),
    error: (message, details) => write('error', message, details),
  };
}
