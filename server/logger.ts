/** A small leveled logger writing one line per event (JSON details) to stdout/stderr. */
export type LogLevel = 'debug' | 'info' | 'warn' | 'error' | 'silent';

export interface Logger {
  debug(message: string, details?: Record<string, unknown>): void;
  info(message: string, details?: Record<string, unknown>): void;
  warn(message: string, details?: Record<string, unknown>): void;
  error(message: string, details?: Record<string, unknown>): void;
}

const ORDER: Record<LogLevel, number> = { debug: 10, info: 20, warn: 30, error: 40, silent: 100 };

function serialise(details?: Record<string, unknown>): string {
  if (!details) return '';
  return ' ' + JSON.stringify(details, (_k, v: unknown) => (v instanceof Error ? { name: v.name, message: v.message, stack: v.stack } : v));
}

export function createLogger(level: LogLevel): Logger {
  const at = ORDER[level];
  const write = (l: Exclude<LogLevel, 'silent'>, message: string, details?: Record<string, unknown>) => {
    if (ORDER[l] < at) return;
    const line = `${new Date().toISOString()} ${l.toUpperCase()} ${message}${serialise(details)}`;
    if (l === 'error' || l === 'warn') console.error(line);
    else console.log(line);
  };
  return {
    debug: (m, d) => write('debug', m, d),
    info: (m, d) => write('info', m, d),
    warn: (m, d) => write('warn', m, d),
    error: (m, d) => write('error', m, d),
  };
}
