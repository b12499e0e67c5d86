import { checkSpool, visitSpoolFigures, type MaterialFinder } from '../../shared/engine/index';
import type {
  CheckStatus,
  CheckSummary,
  ElementCheck,
  SpoolCheck,
} from '../../shared/engine/types';
import type { SpoolDocument } from '../../shared/model/spool';
import type { StoredCheckSummary } from '../db/schema';

const SEVERITY: Record<CheckStatus, number> = {
  pass: 0,
  marginal: 1,
  review: 2,
  fail: 3,
  invalid: 4,
};

export const EMPTY_SUMMARY: CheckSummary = { pass: 0, marginal: 0, fail: 0, review: 0, invalid: 0 };

/** What picking the worst element needs of a result (full check or numbers-only figures). */
type Ranked = Pick<ElementCheck, 'id' | 'status' | 'margin'>;

/** True when `el` is worse than `worst`: higher severity, then the smaller margin (the first wins ties). */
function isWorse(el: Ranked, worst: Ranked | undefined): boolean {
  if (!worst) return true;
  if (SEVERITY[el.status] !== SEVERITY[worst.status])
    return SEVERITY[el.status] > SEVERITY[worst.status];
  return (el.margin ?? Infinity) < (worst.margin ?? Infinity);
}

/** The worst element: highest severity, then the smallest margin, then the first. */
export function findWorstElement<E extends Ranked>(elements: readonly E[]): E | undefined {
  let worst: E | undefined;
  for (const el of elements) if (isWorse(el, worst)) worst = el;
  return worst;
}

/**
 * The stored summary of a document computed on the engine's numbers-first path (no trail, no
 * text, nothing kept per element): what saves, team-material changes and batch re-checks store.
 * Equal to `summarizeCheck(runCheck(doc, findMaterial))`.
 */
export function summarizeDocument(
  doc: SpoolDocument,
  findMaterial?: MaterialFinder,
): StoredCheckSummary {
  let worst: Ranked | undefined;
  const s = visitSpoolFigures(
    doc,
    (f) => {
      if (isWorse(f, worst)) worst = { id: f.id, status: f.status, margin: f.margin };
    },
    findMaterial ? { findMaterial } : {},
  );
  return {
    summary: { ...s.summary },
    worst: worst ? { elementId: worst.id, status: worst.status } : null,
  };
}

/** What a saved spool keeps of its check for lists: counts per status and the worst element. */
export function summarizeCheck(check: SpoolCheck): StoredCheckSummary {
  const worst = findWorstElement(check.elements);
  return {
    summary: { ...check.summary },
    worst: worst ? { elementId: worst.id, status: worst.status } : null,
  };
}

/**
 * Check a validated document with the full trail (with the team's materials when given): for the
 * checker's JSON and shared views that people read. The engine reports rule violations as
 * results, so this only throws on a bug.
 */
export function runCheck(doc: SpoolDocument, findMaterial?: MaterialFinder): SpoolCheck {
  return checkSpool(doc, findMaterial ? { findMaterial } : {});
}
