import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api';

interface FieldDetail {
  path: string;
  message: string;
}

const isFieldDetails = (d: unknown): d is FieldDetail[] =>
  Array.isArray(d) &&
  d.every(
    (x) =>
      x &&
      typeof x === 'object' &&
      typeof (x as FieldDetail).path === 'string' &&
      typeof (x as FieldDetail).message === 'string',
  );

/** `points[0].stressKsi` (server) → `points.0.stressKsi` (react-hook-form). */
export const toFormPath = (path: string) => path.replace(/\[(\d+)\]/g, '.$1');

/**
 * Put the server's field errors (`details: [{ path, message }]`) on the form fields they name.
 * Returns the messages that matched no field, for a form-level alert.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly string[],
): string[] {
  if (!isApiError(error) || !isFieldDetails(error.details))
    return error instanceof Error ? [error.message] : [];
  const rest: string[] = [];
  for (const d of error.details) {
    const p = toFormPath(d.path);
    if (fields.some((f) => p === f || p.startsWith(`${f}.`)))
      setError(p as Path<T>, { type: 'server', message: d.message });
    else rest.push(d.path ? `${d.path}: ${d.message}` : d.message);
  }
  return rest;
}
