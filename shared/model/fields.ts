import { z } from 'zod';

/**
 * Field rules shared by the document schema, the server's routes and the CSV readers, so that
 * every text and integer that reaches storage passes the same gate: bounded length, no U+0000
 * (PostgreSQL refuses it in text and jsonb), no lone UTF-16 surrogate (not valid Unicode; jsonb
 * refuses its escape), integers within PostgreSQL's 32-bit `integer`.
 */

/** Largest value of a PostgreSQL `integer` column (2^31 − 1). */
export const INT4_MAX = 2_147_483_647;

/** Length limits, in UTF-16 code units. */
export const TEXT_LIMITS = {
  /** Element ids, material ids, spec/grade designations. */
  id: 100,
  /** Document, spool, member and material names. */
  name: 200,
  /** Line numbers, tags, NPS and schedule designations. */
  short: 120,
  /** Comments, notes, source notes. */
  long: 4000,
} as const;

// U+0000, a high surrogate not followed by a low one, or a low surrogate not preceded by a high one.
// eslint-disable-next-line no-control-regex -- U+0000 is exactly what this rule refuses
const BAD_TEXT = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Why a string cannot be stored, or undefined when it can. */
export function findTextProblem(s: string): string | undefined {
  const m = BAD_TEXT.exec(s);
  if (!m) return undefined;
  return m[0] === '\u0000'
    ? 'must not contain the NUL character (U+0000)'
    : 'must not contain a lone UTF-16 surrogate (not valid Unicode)';
}

/** True when a string is storable text (no U+0000, no lone surrogate). */
export const isStorableText = (s: string): boolean => !BAD_TEXT.test(s);

/**
 * A string of at most `max` code units without U+0000 or lone surrogates. Trims when asked;
 * `min` counts after trimming.
 */
export function text(max: number, opts: { min?: number; trim?: boolean } = {}) {
  let s = z.string({ error: 'must be text' });
  if (opts.trim) s = s.trim();
  if (opts.min !== undefined && opts.min > 0)
    s = s.min(
      opts.min,
      opts.min === 1 ? 'must not be empty' : `must be at least ${opts.min} characters`,
    );
  return s.max(max, `must be at most ${max} characters`).superRefine((v, ctx) => {
    const problem = findTextProblem(v);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });
}

/** A whole number in [min, max] (max defaults to 2^31 − 1, the largest PostgreSQL integer). */
export function int(min = 0, max = INT4_MAX) {
  return z
    .number({ error: 'must be a whole number' })
    .int('must be a whole number')
    .min(min, `must be at least ${min}`)
    .max(max, `must be at most ${max}`);
}

/** A whole number written as decimal digits (query strings, URL segments), in [min, max]. */
export function intString(min = 0, max = INT4_MAX) {
  return z
    .string()
    .regex(/^\d{1,10}$/, 'must be a whole number')
    .transform(Number)
    .pipe(int(min, max));
}

/** An enum over an object's own keys (never inherited ones such as `__proto__` or `toString`). */
export function ownKeyOf<T extends Record<string, unknown>>(obj: T, message?: string) {
  const keys = Object.keys(obj) as [keyof T & string, ...(keyof T & string)[]];
  return z.enum(keys, { error: message ?? `use one of ${keys.join(', ')}` });
}
