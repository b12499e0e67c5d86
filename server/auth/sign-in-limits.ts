/**
 * In-process fixed-window counters for sign-in and the padding of password-reset answers,
 * applied in front of better-auth's handler (server/app.ts).
 *
 * Sign-in is limited per account (the e-mail, whatever address it comes from) and, more
 * loosely, per client address: colleagues behind one shared address are not locked out by
 * someone guessing at one account from it, and one address cannot spray many accounts.
 */
export interface SignInLimits {
  /** Failed sign-ins per account (e-mail) per window. */
  perAccount: { max: number; windowMs: number };
  /** Sign-in attempts per client address per window. */
  perAddress: { max: number; windowMs: number };
}

export const DEFAULT_SIGN_IN_LIMITS: SignInLimits = {
  perAccount: { max: 5, windowMs: 60_000 },
  perAddress: { max: 60, windowMs: 60_000 },
};

/** Every password-reset request is answered no sooner than this after it arrived. */
export const RESET_ANSWER_MS = 250;

export class WindowCounter {
  private readonly hits = new Map<string, { count: number; resetAt: number }>();
  constructor(
    readonly max: number,
    readonly windowMs: number,
  ) {}

  /** Count one hit; returns whether it is within the limit and when the window ends. */
  hit(key: string, now = Date.now()): { ok: boolean; resetAt: number } {
    let e = this.hits.get(key);
    if (!e || e.resetAt <= now) {
      if (this.hits.size > 50_000) this.sweep(now);
      e = { count: 0, resetAt: now + this.windowMs };
      this.hits.set(key, e);
    }
    e.count++;
    return { ok: e.count <= this.max, resetAt: e.resetAt };
  }

  /** Take back one hit (a successful sign-in does not count against the account). */
  undo(key: string): void {
    const e = this.hits.get(key);
    if (e && e.count > 0) e.count--;
  }

  private sweep(now: number) {
    for (const [k, e] of this.hits) if (e.resetAt <= now) this.hits.delete(k);
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function tooMany(resetAt: number, message: string): Response {
  const retryAfter = Math.max(1, Math.ceil((resetAt - Date.now()) / 1000));
  return new Response(
    JSON.stringify({ error: { code: 'rate_limited', message, details: { retryAfter } } }),
    {
      status: 429,
      headers: {
        'content-type': 'application/json',
        'retry-after': String(retryAfter),
        'cache-control': 'no-store',
      },
    },
  );
}

async function readEmail(request: Request): Promise<string> {
  const len = Number(request.headers.get('content-length') ?? '0');
  if (len > 64 * 1024) return '';
  try {
    const body = (await request.clone().json()) as { email?: unknown };
    return typeof body.email === 'string' ? body.email.trim().toLowerCase().slice(0, 320) : '';
  } catch {
    return '';
  }
}

/**
 * Wrap better-auth's fetch handler: sign-in limits (when `limits` is given) and password-reset
 * answers padded to a constant time, so the answer does not tell a known address from an
 * unknown one (the mail itself goes out in the background).
 */
export function guardAuthHandler(
  handler: (request: Request) => Promise<Response>,
  opts: { limits: SignInLimits | null; resetAnswerMs?: number },
): (request: Request) => Promise<Response> {
  const perAccount = opts.limits
    ? new WindowCounter(opts.limits.perAccount.max, opts.limits.perAccount.windowMs)
    : null;
  const perAddress = opts.limits
    ? new WindowCounter(opts.limits.perAddress.max, opts.limits.perAddress.windowMs)
    : null;
  const resetAnswerMs = opts.resetAnswerMs ?? RESET_ANSWER_MS;
  return async (request) => {
    if (request.method !== 'POST') return handler(request);
    const path = new URL(request.url).pathname;
    if (path.endsWith('/request-password-reset')) {
      const t0 = Date.now();
      const res = await handler(request);
      await sleep(resetAnswerMs - (Date.now() - t0));
      return res;
    }
    if (path.endsWith('/sign-in/email') && perAccount && perAddress) {
      // server/app.ts sets x-forwarded-for from the socket, so the client cannot choose it.
      const address = request.headers.get('x-forwarded-for') ?? 'unknown';
      const email = await readEmail(request);
      const a = perAddress.hit(address);
      if (!a.ok)
        return tooMany(a.resetAt, 'Too many sign-in attempts from your address; try again shortly');
      const accountKey = `account:${email}`;
      const b = perAccount.hit(accountKey);
      if (!b.ok)
        return tooMany(b.resetAt, 'Too many failed sign-ins for this account; try again shortly');
      const res = await handler(request);
      if (res.ok) perAccount.undo(accountKey);
      return res;
    }
    return handler(request);
  };
}
