import { checkSpool, type MaterialFinder } from '../../shared/engine/index';
import type { CheckStatus, CheckSummary, ElementCheck, SpoolCheck } from '../../shared/engine/types';
import type { SpoolDocument } from '../../shared/model/spool';
import type { StoredCheckSummary } from '../db/schema';

const SEVERITY: Record<CheckStatus, number> = { pass: 0, marginal: 1, review: 2, fail: 3, invalid: 4 };

export const EMPTY_SUMMARY: CheckSummary = { pass: 0, marginal: 0, fail: 0, review: 0, invalid: 0 };

/** The worst element: highest severity, then the smallest margin, then the first. */
export function findWorstElement(elements: readonly ElementCheck[]): ElementCheck | undefined {
  let worst: ElementCheck | undefined;
  for (const el of elements) {
    if (!worst) worst = el;
    else if (SEVERITY[el.status] > SEVERITY[worst.status]) worst = el;
    else if (SEVERITY[el.status] === SEVERITY[worst.status] && (el.margin ?? Infinity) < (worst.margin ?? Infinity)) worst = el;
  }
  return worst;
}

/** What a saved spool keeps of its check for lists: counts per status and the worst element. */
export function summarizeCheck(check: SpoolCheck): StoredCheckSummary {
  const worst = findWorstElement(check.elements);
  return { summary: { ...check.summary }, worst: worst ? { elementId: worst.id, status: worst.status } : null };
}

/**
 * Check a validated document (with the team's materials when given); the engine reports rule
 * violations as results, so this only throws on a bug.
 */
export function runCheck(doc: SpoolDocument, findMaterial?: MaterialFinder): SpoolCheck {
  return checkSpool(doc, findMaterial ? { findMaterial } : {});
}
