import type { z } from 'zod';
import { formatPath, spoolDocumentSchema, type FieldIssue, type SpoolDocument } from '../shared/model/spool';
import { validationError } from './errors';

/** Map zod issues to `{ path, message }` with paths such as `document.elements[2].bendRadius`. */
export function toFieldIssues(error: z.ZodError, prefix: readonly PropertyKey[] = []): FieldIssue[] {
  return error.issues.map((iss) => ({ path: formatPath([...prefix, ...iss.path]), message: iss.message }));
}

/** Parse with a zod schema or throw a 422 naming each bad field. */
export function parseBody<S extends z.ZodType>(schema: S, input: unknown, prefix: readonly PropertyKey[] = []): z.output<S> {
  const r = schema.safeParse(input);
  if (!r.success) throw validationError(toFieldIssues(r.error, prefix));
  return r.data;
}

/** Validate a spool document; `prefix` names where it sits in the body (e.g. ['document']). */
export function parseDocument(input: unknown, prefix: readonly PropertyKey[] = []): SpoolDocument {
  if (input === undefined) throw validationError([{ path: formatPath(prefix), message: 'is required' }]);
  return parseBody(spoolDocumentSchema, input, prefix) as SpoolDocument;
}
