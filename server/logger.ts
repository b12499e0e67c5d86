/** A small leveled logger; tests pass `silent` so the suite stays quiet. */
export interface Logger {
  info(message: string, extra?: unknown): void;
  warn(message: string, extra?: unknown): void;
  error(message: string, extra?: unknown): void;
}

export function createLogger(opts: { silent?: boolean } = {}): Logger {
  if (opts.silent) return { info() {}, warn() {}, error() {} };
  const line = (level: string, message: string, extra?: unknown) =>
    `${new Date().toISOString()} ${level} ${message}${extra === undefined ? '' : ` ${extra instanceof Error ? (extra.stack ?? extra.message) : JSON.stringify(extra)}`}`;
  return {
    info: (m, e) => console.log(line('info', m, e)),
    warn: (m, e) => console.warn(line('warn', m, e)),
    error: (m, e) => console.error(line('error', m, e)),
  };
}

export const silentLogger: Logger = createLogger({ silent: true });
