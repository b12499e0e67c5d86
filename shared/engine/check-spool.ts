import type { SpoolDocument, SpoolElement } from '../model/spool';
import { CAUTION } from '../model/caution';
import type {
  CheckStatus,
  CheckSummary,
  ElementCheck,
  ElementFigures,
  SpoolCheck,
  SpoolFigures,
} from './types';
import { checkElement, checkElementFigures } from './check-element';
import type { MaterialFinder, ResolveCache } from './resolve';

export interface CheckOptions {
  /** Material lookup (library plus team materials); defaults to the built-in library. */
  readonly findMaterial?: MaterialFinder;
}

const SEVERITY: Record<CheckStatus, number> = {
  pass: 0,
  marginal: 1,
  review: 2,
  fail: 3,
  invalid: 4,
};

/** The worse of two statuses (invalid > fail > review > marginal > pass). */
export function worseStatus(a: CheckStatus | null, b: CheckStatus): CheckStatus {
  return a === null || SEVERITY[b] > SEVERITY[a] ? b : a;
}

/**
 * Check every element of a spool document (already validated by `parseSpoolDocument`), with the
 * full trail: every case's equation trail with substituted values, the inputs with their sources
 * and the message texts. This is the path for what people read (the inspector, the checker's
 * JSON, the calc sheet). Pure and synchronous; rule violations are element results, never exceptions.
 */
export function checkSpool(doc: SpoolDocument, options: CheckOptions = {}): SpoolCheck {
  const elements: ElementCheck[] = doc.elements.map((el, i) =>
    checkElement(doc, el, i, options.findMaterial),
  );
  return summarise(doc, elements);
}

/**
 * Numbers-first check of a whole spool: every number `checkSpool` gives (statuses, walls, margins,
 * MAWP, cases, lightest schedule, before-bending wall) and the message codes, without building
 * the trail, the inputs list or any text. For stored summaries, batch re-checks and anything that
 * only needs the figures; `checkSpool` / `explainElement` give the trail when someone reads it.
 */
export function checkSpoolFigures(doc: SpoolDocument, options: CheckOptions = {}): SpoolFigures {
  const cache: ResolveCache = new Map();
  const els = doc.elements;
  const elements: ElementFigures[] = new Array<ElementFigures>(els.length);
  for (let i = 0; i < els.length; i++)
    elements[i] = checkElementFigures(doc, els[i]!, i, options.findMaterial, cache);
  return summarise(doc, elements);
}

/** What `visitSpoolFigures` returns: the spool's counts without the per-element figures. */
export interface SpoolFiguresSummary {
  readonly units: SpoolDocument['units'];
  readonly count: number;
  readonly summary: CheckSummary;
  readonly worst: CheckStatus | null;
  readonly caution: string;
}

/**
 * The numbers-first check streamed: `visit` receives each element's figures (the same objects
 * `checkSpoolFigures` would collect) and nothing is kept unless the visitor keeps it. For stored
 * summaries and batch re-checks of whole projects, where holding thousands of result objects only
 * to count them would cost more than computing them.
 */
export function visitSpoolFigures(
  doc: SpoolDocument,
  visit: (figures: ElementFigures) => void,
  options: CheckOptions = {},
): SpoolFiguresSummary {
  const cache: ResolveCache = new Map();
  const els = doc.elements;
  const summary: { -readonly [K in keyof CheckSummary]: number } = {
    pass: 0,
    marginal: 0,
    fail: 0,
    review: 0,
    invalid: 0,
  };
  let worst: CheckStatus | null = null;
  for (let i = 0; i < els.length; i++) {
    const f = checkElementFigures(doc, els[i]!, i, options.findMaterial, cache);
    summary[f.status] += 1;
    worst = worseStatus(worst, f.status);
    visit(f);
  }
  return { units: doc.units, count: els.length, summary, worst, caution: CAUTION };
}

/**
 * The full check of one element, trail included, found by id (or null when the document has no
 * such element). For the calc sheet and any view of a single element's working.
 */
export function explainElement(
  doc: SpoolDocument,
  elementId: string,
  options: CheckOptions = {},
): ElementCheck | null {
  const index = doc.elements.findIndex((e) => e.id === elementId);
  const el = doc.elements[index];
  return el ? checkElement(doc, el, index, options.findMaterial) : null;
}

function summarise<E extends { readonly status: CheckStatus }>(
  doc: SpoolDocument,
  elements: readonly E[],
): {
  units: SpoolDocument['units'];
  elements: readonly E[];
  summary: CheckSummary;
  worst: CheckStatus | null;
  caution: string;
} {
  const summary: { -readonly [K in keyof CheckSummary]: number } = {
    pass: 0,
    marginal: 0,
    fail: 0,
    review: 0,
    invalid: 0,
  };
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
 * Results are identical to `checkSpool` (same pure function per element, full trail).
 * Unchanged positions are found by comparing with the previous document's element array (no
 * hashing); elements that moved are found through a WeakMap and re-checked only if their index changed.
 */
export function createSpoolChecker(options: CheckOptions = {}): (doc: SpoolDocument) => SpoolCheck {
  let cache = new WeakMap<SpoolElement, ElementCheck>();
  let lastConditions: SpoolDocument['conditions'] | null = null;
  let lastUnits: SpoolDocument['units'] | null = null;
  let lastElements: readonly SpoolElement[] = [];
  let lastResults: readonly ElementCheck[] = [];
  // Severity per position, kept beside the results so counting never touches the result objects.
  let lastSeverity = new Uint8Array(0);
  let lastDoc: SpoolDocument | null = null;
  let lastCheck: SpoolCheck | null = null;
  return (doc) => {
    if (doc === lastDoc && lastCheck) return lastCheck;
    if (doc.conditions !== lastConditions || doc.units !== lastUnits) {
      cache = new WeakMap();
      lastElements = [];
      lastResults = [];
      lastConditions = doc.conditions;
      lastUnits = doc.units;
    }
    const els = doc.elements;
    const n = els.length;
    const results: ElementCheck[] = new Array<ElementCheck>(n);
    const severity = new Uint8Array(n);
    for (let i = 0; i < n; i++) {
      const el = els[i]!;
      if (lastElements[i] === el) {
        results[i] = lastResults[i]!;
        severity[i] = lastSeverity[i]!;
        continue;
      }
      let result = cache.get(el);
      if (!result || result.index !== i) {
        result = checkElement(doc, el, i, options.findMaterial);
        cache.set(el, result);
      }
      results[i] = result;
      severity[i] = SEVERITY[result.status];
    }
    lastElements = els;
    lastResults = results;
    lastSeverity = severity;
    lastDoc = doc;
    lastCheck = {
      units: doc.units,
      elements: results,
      ...countSeverities(severity),
      caution: CAUTION,
    };
    return lastCheck;
  };
}

const BY_SEVERITY: readonly CheckStatus[] = ['pass', 'marginal', 'review', 'fail', 'invalid'];

/** Summary counts and the worst status from per-element severities (same as folding worseStatus). */
function countSeverities(severity: Uint8Array): {
  summary: CheckSummary;
  worst: CheckStatus | null;
} {
  const counts = [0, 0, 0, 0, 0];
  for (let i = 0; i < severity.length; i++) counts[severity[i]!]! += 1;
  let worst: CheckStatus | null = null;
  for (let k = 0; k < counts.length; k++) if (counts[k]! > 0) worst = BY_SEVERITY[k]!;
  return {
    summary: {
      pass: counts[0]!,
      marginal: counts[1]!,
      fail: counts[3]!,
      review: counts[2]!,
      invalid: counts[4]!,
    },
    worst,
  };
}
