import type { SpoolDocument, SpoolElement } from '../model/spool';
import { CAUTION } from '../model/caution';
import type { CheckStatus, CheckSummary, ElementCheck, SpoolCheck } from './types';
import { checkElement } from './check-element';
import type { MaterialFinder } from './resolve';

export interface CheckOptions {
  /** Material lookup (library plus team materials); defaults to the built-in library. */
  readonly findMaterial?: MaterialFinder;
}

const SEVERITY: Record<CheckStatus, number> = { pass: 0, marginal: 1, review: 2, fail: 3, invalid: 4 };

/** The worse of two statuses (invalid > fail > review > marginal > pass). */
export function worseStatus(a: CheckStatus | null, b: CheckStatus): CheckStatus {
  return a === null || SEVERITY[b] > SEVERITY[a] ? b : a;
}

/**
 * Check every element of a spool document (already validated by `parseSpoolDocument`).
 * Pure and synchronous; rule violations are element results, never exceptions.
 */
export function checkSpool(doc: SpoolDocument, options: CheckOptions = {}): SpoolCheck {
  const elements: ElementCheck[] = doc.elements.map((el, i) => checkElement(doc, el, i, options.findMaterial));
  return summarise(doc, elements);
}

function summarise(doc: SpoolDocument, elements: readonly ElementCheck[]): SpoolCheck {
  const summary: { -readonly [K in keyof CheckSummary]: number } = { pass: 0, marginal: 0, fail: 0, review: 0, invalid: 0 };
  let worst: CheckStatus | null = null;
  for (const e of elements) {
    summary[e.status] += 1;
    worst = worseStatus(worst, e.status);
  }
  return { units: doc.units, elements, summary, worst, caution: CAUTION };
}

/**
 * A checker that reuses the result of every element whose object, spool conditions, units and
 * position are unchanged since the last call. Documents are immutable, so an edit re-checks only
 * the elements it touched: the sketcher re-colours one element without re-checking a thousand.
 * Results are identical to `checkSpool` (same pure function per element).
 */
export function createSpoolChecker(options: CheckOptions = {}): (doc: SpoolDocument) => SpoolCheck {
  let cache = new WeakMap<SpoolElement, { index: number; result: ElementCheck }>();
  let lastConditions: SpoolDocument['conditions'] | null = null;
  let lastUnits: SpoolDocument['units'] | null = null;
  return (doc) => {
    if (doc.conditions !== lastConditions || doc.units !== lastUnits) {
      cache = new WeakMap();
      lastConditions = doc.conditions;
      lastUnits = doc.units;
    }
    const elements = doc.elements.map((el, i) => {
      const hit = cache.get(el);
      if (hit && hit.index === i) return hit.result;
      const result = checkElement(doc, el, i, options.findMaterial);
      cache.set(el, { index: i, result });
      return result;
    });
    return summarise(doc, elements);
  };
}
