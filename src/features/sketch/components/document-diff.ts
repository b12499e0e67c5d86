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
  return [...keys].filter((k) => !same((a as Record<string, unknown> | undefined)?.[k], (b as Record<string, unknown> | undefined)?.[k])).sort();
}

/**
 * What differs between `mine` and `theirs`: document fields, design conditions and each element
 * by id (added in mine / removed from mine / changed fields). Order of elements counts as a
 * change of the spool's `elements order` when the ids are the same but differently arranged.
 */
export function diffDocuments(mine: SpoolDocument, theirs: SpoolDocument): DocumentChange[] {
  const out: DocumentChange[] = [];
  const top = differingKeys(
    { units: mine.units, name: mine.name, line: mine.line, origin: mine.origin, defaultBendRadius: mine.defaultBendRadius },
    { units: theirs.units, name: theirs.name, line: theirs.line, origin: theirs.origin, defaultBendRadius: theirs.defaultBendRadius },
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
  for (const el of theirs.elements) if (!mineIds.has(el.id)) out.push({ target: el.id, change: 'removed', fields: [] });
  const commonMine = mine.elements.map((e) => e.id).filter((id) => theirById.has(id));
  const commonTheirs = theirs.elements.map((e) => e.id).filter((id) => mineIds.has(id));
  if (!same(commonMine, commonTheirs)) out.push({ target: 'spool', change: 'changed', fields: ['elements order'] });
  return out;
}
