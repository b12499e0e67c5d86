import type { RequestHandler } from 'express';
import type { z } from 'zod';
import {
  formatPath,
  spoolDocumentSchema,
  type FieldIssue,
  type SpoolDocument,
} from '../shared/model/spool';
import { INT4_MAX, TEXT_LIMITS, findTextProblem } from '../shared/model/fields';
import { HttpError, notFound, validationError } from './errors';

/**
 * The request validation layer. Three gates every /api request passes before a route runs —
 * the URL path (percent-decoding, storable text), the query string and the JSON body (storable
 * text anywhere) — and the helpers routes use for their own params, query and body, all built
 * on the shared field rules (shared/model/fields.ts), so no value PostgreSQL would refuse or
 * overflow reaches it and each refusal names its field.
 */

/** Map zod issues to `{ path, message }` with paths such as `document.elements[2].bendRadius`. */
export function toFieldIssues(
  error: z.ZodError,
  prefix: readonly PropertyKey[] = [],
): FieldIssue[] {
  return error.issues.map((iss) => ({
    path: formatPath([...prefix, ...iss.path]),
    message: iss.message,
  }));
}

/** Parse with a zod schema or throw a 422 naming each bad field. */
export function parseBody<S extends z.ZodType>(
  schema: S,
  input: unknown,
  prefix: readonly PropertyKey[] = [],
): z.output<S> {
  const r = schema.safeParse(input);
  if (!r.success) throw validationError(toFieldIssues(r.error, prefix));
  return r.data;
}

/** Validate a spool document; `prefix` names where it sits in the body (e.g. ['document']). */
export function parseDocument(input: unknown, prefix: readonly PropertyKey[] = []): SpoolDocument {
  if (input === undefined)
    throw validationError([{ path: formatPath(prefix), message: 'is required' }]);
  return parseBody(spoolDocumentSchema, input, prefix) as SpoolDocument;
}

/** Longest URL path segment accepted (ids are far shorter). */
const MAX_SEGMENT = 200;

/**
 * A text id from the URL (spool, share, member, material ids): anything that cannot be a stored
 * id is simply not found. The path gate has already refused undecodable or unstorable segments.
 */
export function textParam(
  raw: unknown,
  what = 'Not found',
  max: number = TEXT_LIMITS.name,
): string {
  const id = typeof raw === 'string' ? raw : '';
  if (id.length === 0 || id.length > max || findTextProblem(id) !== undefined) throw notFound(what);
  return id;
}

/** A whole-number id from the URL (revisions, comment ids): outside 0 … 2^31 − 1 it cannot exist. */
export function intParam(raw: unknown, what = 'Not found'): number {
  const s = typeof raw === 'string' ? raw : '';
  if (!/^\d{1,10}$/.test(s)) throw notFound(what);
  const n = Number(s);
  if (n > INT4_MAX) throw notFound(what);
  return n;
}

/** Percent-decodes each path segment and refuses ones no route could hold. */
export const guardPath: RequestHandler = (req, _res, next) => {
  const segments = req.path.split('/');
  for (const seg of segments) {
    if (seg === '') continue;
    let decoded: string;
    try {
      decoded = decodeURIComponent(seg);
    } catch {
      next(
        new HttpError(400, 'bad_request', 'The URL is not valid percent-encoding', [
          { path: 'url', message: `segment "${seg.slice(0, 40)}" is not valid percent-encoding` },
        ]),
      );
      return;
    }
    const problem = findTextProblem(decoded);
    if (problem) {
      next(
        new HttpError(400, 'bad_request', `The URL ${problem}`, [
          { path: 'url', message: problem },
        ]),
      );
      return;
    }
    if (decoded.length > MAX_SEGMENT) {
      next(
        new HttpError(
          400,
          'bad_request',
          `A URL segment is longer than ${MAX_SEGMENT} characters`,
          [{ path: 'url', message: `segment is longer than ${MAX_SEGMENT} characters` }],
        ),
      );
      return;
    }
  }
  next();
};

/** Longest query value accepted. */
const MAX_QUERY_VALUE = 1000;

/** Query keys and values must be storable text of bounded length. */
export const guardQuery: RequestHandler = (req, _res, next) => {
  const issues: FieldIssue[] = [];
  const q = req.query as Record<string, unknown>;
  for (const key of Object.keys(q)) {
    const path = `query.${key.slice(0, 60)}`;
    const keyProblem = findTextProblem(key);
    if (keyProblem || key.length > 100) {
      issues.push({
        path: 'query',
        message: keyProblem
          ? `a parameter name ${keyProblem}`
          : 'a parameter name is longer than 100 characters',
      });
      continue;
    }
    const values = Array.isArray(q[key]) ? (q[key] as unknown[]) : [q[key]];
    for (const v of values) {
      if (typeof v !== 'string') continue;
      const problem = findTextProblem(v);
      if (problem) issues.push({ path, message: problem });
      else if (v.length > MAX_QUERY_VALUE)
        issues.push({ path, message: `must be at most ${MAX_QUERY_VALUE} characters` });
    }
  }
  next(
    issues.length > 0 ? validationError(issues, 'The query string has invalid values') : undefined,
  );
};

/** Most problems reported for one body. */
const MAX_ISSUES = 50;

/**
 * Find strings (values and keys) PostgreSQL could not store, anywhere in a parsed JSON body.
 * Iterative, so a deeply nested body cannot overflow the stack.
 */
export function findBodyTextIssues(
  body: unknown,
  prefix: readonly PropertyKey[] = [],
): FieldIssue[] {
  interface Node {
    value: unknown;
    parent: Node | null;
    key: PropertyKey | null;
  }
  // Paths are rebuilt from parent links only for a problem, so a deep body costs O(size).
  const pathOf = (n: Node, last?: PropertyKey): string => {
    const keys: PropertyKey[] = last === undefined ? [] : [last];
    for (let x: Node | null = n; x && x.key !== null; x = x.parent) keys.push(x.key);
    return formatPath([...prefix, ...keys.reverse()]);
  };
  const issues: FieldIssue[] = [];
  const stack: Node[] = [{ value: body, parent: null, key: null }];
  while (stack.length > 0 && issues.length < MAX_ISSUES) {
    const node = stack.pop()!;
    const { value } = node;
    if (typeof value === 'string') {
      const problem = findTextProblem(value);
      if (problem) issues.push({ path: pathOf(node), message: problem });
    } else if (Array.isArray(value)) {
      for (let i = value.length - 1; i >= 0; i--)
        stack.push({ value: value[i], parent: node, key: i });
    } else if (value !== null && typeof value === 'object') {
      for (const [k, v] of Object.entries(value)) {
        const problem = findTextProblem(k);
        if (problem)
          issues.push({ path: pathOf(node, '(key)'), message: `a field name ${problem}` });
        else stack.push({ value: v, parent: node, key: k });
      }
    }
  }
  return issues;
}

/** A JSON body with unstorable text anywhere is refused with each place named. */
export const guardBody: RequestHandler = (req, _res, next) => {
  if (req.body === undefined || req.body === null || typeof req.body !== 'object') {
    next();
    return;
  }
  const issues = findBodyTextIssues(req.body);
  next(issues.length > 0 ? validationError(issues) : undefined);
};
