import { createHash, randomBytes } from 'node:crypto';

/** A new share token for the public URL (shown once) and the hash that is stored. */
export function newShareToken(): { token: string; hash: string } {
  const token = randomBytes(24).toString('base64url');
  return { token, hash: hashShareToken(token) };
}

/** sha-256 (hex) of a share token, as stored in share_links.token_hash. */
export function hashShareToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

const WITHHELD = 'team material (its source note is not shown on shared links)';

/**
 * A copy of `value` (a check result) without the team's material source notes: the public view
 * of a share link shows the team's numbers but not its internal references.
 */
export function omitSourceNotes<T>(value: T, notes: readonly string[]): T {
  const usable = [...new Set(notes.filter((n) => n.trim().length > 0))].sort(
    (a, b) => b.length - a.length,
  );
  if (usable.length === 0) return value;
  const scrub = (s: string): string => {
    let out = s;
    for (const n of usable) {
      out = out.split(`Team materials upload: ${n}`).join(WITHHELD);
      out = out.split(`the source note "${n}"`).join('a source note');
      if (n.length >= 6) out = out.split(n).join('[withheld]');
    }
    return out;
  };
  const walk = (v: unknown): unknown => {
    if (typeof v === 'string') return scrub(v);
    if (Array.isArray(v)) return v.map(walk);
    if (v && typeof v === 'object')
      return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x)]));
    return v;
  };
  return walk(value) as T;
}
