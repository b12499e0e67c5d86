import type { SpoolDocument, SpoolElement } from '@shared/model/spool';

export interface DocumentChange {
  /** An element id, or "conditions" / "spool" for document-level fields. */
  readonly target: string;
  readonly change: 'added' | 'removed' | 'changed';
  /** Field names that differ (for `changed`). */
  readonly fields: readonly string[];
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

function differingKeys(a: object | undefined, b: object | undefined): string[] {
  const keys = new Set([...Object.keys(a ?? {}), ...Object.keys(b ?? {})]);
  return [...keys]
    .filter(
      (k) =>
        !same(
          (a as Record<string, unknown> | undefined)?.[k],
          (b as Record<string, unknown> | undefined)?.[k],
        ),
    )
    .sort();
}

/**
 * What differs between `mine` and `theirs`: document fields, design conditions and each element
 * by id (added in mine / removed from mine / changed fields). Order of elements counts as a
 * change of the spool's `elements order` when the ids are the same but differently arranged.
 */
export function diffDocuments(mine: SpoolDocument, theirs: SpoolDocument): DocumentChange[] {
  const out: DocumentChange[] = [];
  const top = differingKeys(
    {
      units: mine.units,
      name: mine.name,
      line: mine.line,
      origin: mine.origin,
      defaultBendRadius: mine.defaultBendRadius,
    },
    {
      units: theirs.units,
      name: theirs.name,
      line: theirs.line,
      origin: theirs.origin,
      defaultBendRadius: theirs.defaultBendRadius,
    },
  );
  if (top.length > 0) out.push({ target: 'spool', change: 'changed', fields: top });
  const cond = differingKeys(mine.conditions, theirs.conditions);
  if (cond.length > 0) out.push({ target: 'conditions', change: 'changed', fields: cond });
  const theirById = new Map<string, SpoolElement>(theirs.elements.map((e) => [e.id, e]));
  const mineIds = new Set(mine.elements.map((e) => e.id));
  for (const el of mine.elements) {
    const other = theirById.get(el.id);
    if (!other) out.push({ target: el.id, change: 'added', fields: [] });
    else {
      const fields = differingKeys(el, other);
      if (fields.length > 0) out.push({ target: el.id, change: 'changed', fields });
    }
  }
  for (const el of theirs.elements)
    if (!mineIds.has(el.id)) out.push({ target: el.id, change: 'removed', fields: [] });
  const commonMine = mine.elements.map((e) => e.id).filter((id) => theirById.has(id));
  const commonTheirs = theirs.elements.map((e) => e.id).filter((id) => mineIds.has(id));
  if (!same(commonMine, commonTheirs))
    out.push({ target: 'spool', change: 'changed', fields: ['elements order'] });
  return out;
}

/** One field that differs: its path (nested fields joined by dots) and both values. */
export interface FieldChange {
  readonly field: string;
  readonly before: unknown;
  readonly after: unknown;
}

const isPlainObject = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * Field-level differences from `before` to `after`: nested objects are walked (`conditions.pressure`,
 * `bendRadius.multipleOfD`), arrays and scalars compared whole. A field missing on one side has
 * `undefined` there. Sorted by path.
 */
export function diffFields(before: unknown, after: unknown, prefix = ''): FieldChange[] {
  if (isPlainObject(before) && isPlainObject(after)) {
    const out: FieldChange[] = [];
    for (const k of [...new Set([...Object.keys(before), ...Object.keys(after)])].sort()) {
      out.push(...diffFields(before[k], after[k], prefix ? `${prefix}.${k}` : k));
    }
    return out;
  }
  if (same(before, after)) return [];
  if (isPlainObject(before) || isPlainObject(after)) {
    // An object on one side only: list its fields against nothing, so each reads "— → value".
    const obj = (isPlainObject(before) ? before : after) as Record<string, unknown>;
    const other = isPlainObject(before) ? after : before;
    if (other === undefined) {
      return Object.keys(obj)
        .sort()
        .flatMap((k) =>
          diffFields(
            isPlainObject(before) ? obj[k] : undefined,
            isPlainObject(after) ? obj[k] : undefined,
            prefix ? `${prefix}.${k}` : k,
          ),
        );
    }
  }
  return [{ field: prefix || '(value)', before, after }];
}
