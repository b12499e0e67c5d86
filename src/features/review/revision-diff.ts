import type { CheckStatus, SpoolCheck } from '@shared/engine';
import type { SpoolDocument, SpoolElement } from '@shared/model/spool';
import {
  diffDocuments,
  diffFields,
  type FieldChange,
} from '@/features/sketch/components/document-diff';

export interface RevisionSide {
  readonly revision: number;
  readonly document: SpoolDocument;
  /** The check of the document (per element status); omit to compare documents only. */
  readonly check?: Pick<SpoolCheck, 'elements'> | undefined;
}

export interface ElementRef {
  readonly id: string;
  readonly kind: SpoolElement['kind'];
}

export interface RevisionDiff {
  readonly from: number;
  readonly to: number;
  readonly added: readonly ElementRef[];
  readonly removed: readonly ElementRef[];
  /** Elements (by id) and the document-level targets "spool" and "conditions" whose fields differ. */
  readonly changed: readonly { readonly target: string; readonly fields: readonly FieldChange[] }[];
  /** Elements present in both whose check status differs. */
  readonly statusChanges: readonly {
    readonly id: string;
    readonly before: CheckStatus;
    readonly after: CheckStatus;
  }[];
}

const SPOOL_FIELDS = ['units', 'name', 'line', 'origin', 'defaultBendRadius'] as const;
const pick = (d: SpoolDocument) => Object.fromEntries(SPOOL_FIELDS.map((k) => [k, d[k]]));

/**
 * What changed from revision `a` to revision `b`: elements added and removed (by id), fields
 * changed with old → new values (spool fields, design conditions, each element), the order of
 * elements, and check status changes of elements kept.
 */
export function diffRevisions(a: RevisionSide, b: RevisionSide): RevisionDiff {
  // diffDocuments names additions from its first argument's point of view: pass the newer first.
  const changes = diffDocuments(b.document, a.document);
  const oldById = new Map(a.document.elements.map((e) => [e.id, e]));
  const newById = new Map(b.document.elements.map((e) => [e.id, e]));
  const added: ElementRef[] = [];
  const removed: ElementRef[] = [];
  const changed: { target: string; fields: FieldChange[] }[] = [];
  for (const c of changes) {
    if (c.change === 'added') {
      const el = newById.get(c.target);
      if (el) added.push({ id: el.id, kind: el.kind });
    } else if (c.change === 'removed') {
      const el = oldById.get(c.target);
      if (el) removed.push({ id: el.id, kind: el.kind });
    } else if (c.target === 'spool') {
      const fields = diffFields(pick(a.document), pick(b.document));
      if (c.fields.includes('elements order')) {
        const order = (d: SpoolDocument, keep: Map<string, unknown>) =>
          d.elements
            .map((e) => e.id)
            .filter((id) => keep.has(id))
            .join(' ');
        fields.push({
          field: 'elements order',
          before: order(a.document, newById),
          after: order(b.document, oldById),
        });
      }
      const existing = changed.find((x) => x.target === 'spool');
      if (existing) existing.fields.push(...fields);
      else if (fields.length > 0) changed.push({ target: 'spool', fields });
    } else if (c.target === 'conditions') {
      changed.push({
        target: 'conditions',
        fields: diffFields(a.document.conditions, b.document.conditions),
      });
    } else {
      changed.push({
        target: c.target,
        fields: diffFields(oldById.get(c.target), newById.get(c.target)),
      });
    }
  }
  const statusChanges: { id: string; before: CheckStatus; after: CheckStatus }[] = [];
  if (a.check && b.check) {
    const before = new Map(a.check.elements.map((e) => [e.id, e.status]));
    for (const e of b.check.elements) {
      const was = before.get(e.id);
      if (was !== undefined && was !== e.status)
        statusChanges.push({ id: e.id, before: was, after: e.status });
    }
  }
  return { from: a.revision, to: b.revision, added, removed, changed, statusChanges };
}

/** A field value as the comparison shows it. */
export function formatDiffValue(v: unknown): string {
  if (v === undefined || v === null || v === '') return '—';
  if (typeof v === 'string') return v;
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  return JSON.stringify(v);
}

/** True when nothing differs. */
export const isEmptyDiff = (d: RevisionDiff) =>
  d.added.length + d.removed.length + d.changed.length + d.statusChanges.length === 0;
