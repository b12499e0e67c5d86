/** A small leveled logger; tests pass `silent` so the suite stays quiet. */
export interface Logger {
  info(message: string, extra?: unknown): void;
  warn(message: string, extra?: unknown): void;
  error(message: string, extra?: unknown): void;
}

export function createLogger(opts: { silent?: boolean } = {}): Logger {
  if (opts.silent) return { info() {}, warn() {}, error() {} };
  const line = (level: string, message: string, extra?: unknown) =>
    `${new Date().toISOString()} ${level} ${redactQuery(message)}${extra === undefined ? '' : ` ${describeExtra(extra)}`}`;
  return {
    info: (m, e) => console.log(line('info', m, e)),
    warn: (m, e) => console.warn(line('warn', m, e)),
    error: (m, e) => console.error(line('error', m, e)),
  };
}

export const silentLogger: Logger = createLogger({ silent: true });

/**
 * What the log keeps of an unexpected error: its name, message and stack, with database
 * errors reduced to the driver's code and message. A failed query's SQL text and parameters
 * (which carry user data: documents, names, e-mail addresses) never reach the log.
 */
export function describeFault(err: unknown): string {
  const parts: string[] = [];
  let e: unknown = err;
  let fromDatabase = false;
  for (let depth = 0; e && depth < 4; depth++) {
    const x = e as {
      name?: unknown;
      message?: unknown;
      code?: unknown;
      stack?: unknown;
      cause?: unknown;
      query?: unknown;
    };
    const name = typeof x.name === 'string' ? x.name : 'Error';
    let message = typeof x.message === 'string' ? x.message : String(e);
    const isQuery = typeof x.query === 'string' || /^Failed query:/.test(message);
    if (isQuery) message = 'a database query failed';
    // The database's own message may quote a value it refused: keep its words, not the value.
    else if (fromDatabase) message = message.replace(/"[^"]*"|'[^']*'/g, '"…"');
    fromDatabase ||= isQuery;
    const code = typeof x.code === 'string' ? ` [${x.code}]` : '';
    const stack =
      !isQuery && typeof x.stack === 'string' ? x.stack.split('\n').slice(1, 6).join('\n') : '';
    parts.push(`${name}${code}: ${message}${stack ? `\n${stack}` : ''}`);
    e = x.cause;
  }
  return parts.join('\ncaused by ');
}

/** A log line never carries SQL text: drop everything from "Failed query:" on. */
function redactQuery(s: string): string {
  const i = s.indexOf('Failed query:');
  return i < 0 ? s : `${s.slice(0, i)}a database query failed`;
}

function describeExtra(extra: unknown): string {
  if (extra instanceof Error) return describeFault(extra);
  if (Array.isArray(extra)) return extra.map(describeExtra).join(' ');
  if (typeof extra === 'string') return redactQuery(extra);
  try {
    return redactQuery(JSON.stringify(extra) ?? String(extra));
  } catch {
    return String(extra);
  }
}
