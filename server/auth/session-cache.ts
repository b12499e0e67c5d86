/**
 * Sessions read in the last few seconds, keyed by the request's Cookie header, so that most
 * signed-in requests skip both better-auth's session lookup and the database.
 *
 * Revocation is immediate in this process: better-auth's session delete hooks (sign-out,
 * password reset, revoke) and member removal drop the entries, and a lookup that started
 * before a revocation is not stored. Another server process on the same PostgreSQL sees a
 * revocation within `ttlMs` (the database is the source of truth on every miss).
 */
export interface CachedSession {
  user: { id: string; email: string; name: string };
  session: { token: string; userId: string; expiresAt: Date };
}

interface Entry {
  value: CachedSession;
  until: number;
}

export class SessionCache {
  private readonly entries = new Map<string, Entry>();
  /** Bumped by every revocation; a lookup that began under an older generation is not kept. */
  private generation = 0;

  constructor(
    readonly ttlMs = 5_000,
    private readonly maxEntries = 10_000,
  ) {}

  get(cookie: string): CachedSession | undefined {
    const hit = this.entries.get(cookie);
    if (!hit) return undefined;
    if (hit.until <= Date.now()) {
      this.entries.delete(cookie);
      return undefined;
    }
    return hit.value;
  }

  /** The generation to hand back to `set` (read it before the lookup starts). */
  begin(): number {
    return this.generation;
  }

  set(cookie: string, value: CachedSession, startedAt: number): void {
    if (startedAt !== this.generation) return;
    const until = Math.min(Date.now() + this.ttlMs, value.session.expiresAt.getTime());
    if (until <= Date.now()) return;
    if (this.entries.size >= this.maxEntries) this.entries.clear();
    this.entries.set(cookie, { value, until });
  }

  revokeToken(token: string): void {
    this.generation++;
    for (const [k, e] of this.entries) if (e.value.session.token === token) this.entries.delete(k);
  }

  revokeUser(userId: string): void {
    this.generation++;
    for (const [k, e] of this.entries)
      if (e.value.session.userId === userId) this.entries.delete(k);
  }

  get size(): number {
    return this.entries.size;
  }
}
