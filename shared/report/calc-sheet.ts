/**
 * The calc sheet: the filed record of one spool revision's wall check. A pure model (strings
 * ready to print, in the document's units) shared by the PDF renderer, the browser print view
 * and the headless checker, so every copy of the record says the same thing.
 */
import type {
  CaseResult,
  CheckStatus,
  ElementCheck,
  SourcedValue,
  SpoolCheck,
  TrailStep,
} from '../engine/types';
import { fmt } from '../engine/format';
import { EXTERNAL_BASIS_LABEL } from '../engine';
import { CAUTION } from '../model/caution';
import type { Conditions, SpoolDocument, SpoolElement } from '../model/spool';
import { UNIT_LABELS } from '../units/units';

/** One recorded lifecycle move (from the server's transition events). */
export interface CalcSheetEventInput {
  readonly revision: number;
  readonly from: string;
  readonly to: string;
  readonly note: string | null;
  readonly user: { readonly name: string } | null;
  /** ISO 8601 time of the move. */
  readonly createdAt: string;
}

export interface CalcSheetInput {
  /** Team name; null when the sheet is made outside a team (headless checker, shared copy). */
  readonly team: string | null;
  /** Engineering revision; null when the document has none (headless checker). */
  readonly revision: number | null;
  /** Lifecycle state of the revision (draft, submitted, checked, released); null when unknown. */
  readonly state: string | null;
  readonly document: SpoolDocument;
  /** The engine's full result (with every trail) for `document`. */
  readonly check: SpoolCheck;
  /** Transition events; only those of `revision` are shown. */
  readonly history: readonly CalcSheetEventInput[];
  /** Shown instead of the history table when there are no events (e.g. why it is left out). */
  readonly historyNote?: string;
  /** ISO 8601 time the sheet was made (passed in: the model has no clock). */
  readonly generatedAt: string;
  /** Where the copy came from, e.g. "shared link, created 2026-12-01 10:00 UTC". */
  readonly origin?: string;
}

/** A labelled value with where it came from. */
export interface SheetRow {
  readonly label: string;
  readonly value: string;
  readonly source?: string;
  /** Recalled from memory: verify against the licensed edition. */
  readonly fromMemory?: boolean;
  /** Highlighted (the governing figure, an "order heavier" flag). */
  readonly strong?: boolean;
}

export interface SheetTrailStep {
  readonly label: string;
  readonly equation: string;
  readonly formula: string;
  readonly substituted: string;
  /** "t = 0.03554 in". */
  readonly result: string;
}

export interface SheetTrailGroup {
  /** "bend intrados (governing)", "wall before bending". */
  readonly title: string;
  readonly governing: boolean;
  readonly steps: readonly SheetTrailStep[];
}

export interface SheetCase {
  readonly location: string;
  readonly equation: string;
  readonly I: string;
  readonly t: string;
  readonly tm: string;
  readonly orderedWall: string;
  readonly allowablePressure: string;
  readonly governing: boolean;
}

export interface SheetInput {
  readonly symbol: string;
  readonly label: string;
  readonly value: string;
  readonly source: string;
  readonly fromMemory: boolean;
}

export interface SheetElement {
  readonly id: string;
  readonly kind: 'straight' | 'bend';
  /** "Bend B1". */
  readonly title: string;
  readonly status: CheckStatus;
  /** "PASS", "MARGINAL", … */
  readonly statusLabel: string;
  /** Size and geometry in one line: "NPS 4 / Sch 40 · R1 12 in (3D) · 90°". */
  readonly description: string;
  readonly governing: string;
  /** As the inspector shows them: t, tm, ordered wall, chosen wall, margin, MAWP, lightest schedule, wall before bending. */
  readonly figures: readonly SheetRow[];
  readonly cases: readonly SheetCase[];
  readonly preBend: readonly SheetRow[] | null;
  readonly messages: readonly { readonly level: string; readonly text: string }[];
  /** Input problems that made the element uncheckable. */
  readonly issues: readonly string[];
  readonly trail: readonly SheetTrailGroup[];
  readonly inputs: readonly SheetInput[];
  readonly fromMemoryCount: number;
}

export interface SheetEvent {
  readonly when: string;
  readonly move: string;
  readonly who: string;
  readonly note: string;
}

export interface SheetOverviewRow {
  readonly id: string;
  readonly kind: string;
  readonly size: string;
  readonly governing: string;
  readonly orderedWall: string;
  readonly chosenWall: string;
  readonly margin: string;
  readonly status: string;
}

export interface CalcSheet {
  readonly title: string;
  readonly spoolName: string;
  /** "rev. 2 · released", or "no revision" for the headless checker. */
  readonly revisionLabel: string;
  /** One line for the running header of every page. */
  readonly runningHeader: string;
  /** Team, spool, line, revision, state, units, generated. */
  readonly identity: readonly SheetRow[];
  /** The spool's design conditions as given, with their source. */
  readonly conditions: readonly SheetRow[];
  /** Values the check took for elements without overrides (allowable stress, E, W, Y, mill tolerance …) with sources. */
  readonly derived: readonly SheetRow[];
  readonly summary: string;
  readonly overview: readonly SheetOverviewRow[];
  readonly elements: readonly SheetElement[];
  readonly history: readonly SheetEvent[];
  readonly historyNote: string;
  readonly fromMemoryCount: number;
  readonly caution: string;
  readonly units: string;
}

export const CALC_SHEET_TITLE = 'Calculation sheet: pipe wall thickness (ASME B31.3)';

const DASH = '—';

const CASE_LABELS: Record<string, string> = {
  straight: 'straight pipe',
  intrados: 'bend intrados',
  extrados: 'bend extrados',
  sidewall: 'bend sidewall',
  external: 'external pressure',
};

/** Human label of a check case ("bend intrados"). */
export const caseLabelOf = (c: string | null | undefined): string =>
  c ? (CASE_LABELS[c] ?? c) : DASH;

const MOVE_LABELS: Record<string, string> = {
  'draft>submitted': 'submitted for check',
  'submitted>checked': 'checked',
  'submitted>draft': 'returned to designer',
  'checked>released': 'released for fabrication',
  'checked>draft': 'edited: reopened as a new revision',
  'released>draft': 'edited: reopened as a new revision',
};

/** "Page 2 of 7": the footer of every page. */
export function pageLabel(page: number, total: number): string {
  return `Page ${page} of ${total}`;
}

/** ISO time as "2026-12-02 15:16 UTC" (deterministic: no locale, no time zone of the machine). */
export function formatUtc(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

const withUnit = (v: number | null | undefined, unit: string): string =>
  v === null || v === undefined || !Number.isFinite(v) ? DASH : unit ? `${fmt(v)} ${unit}` : fmt(v);

const share = (f: number): string => (Number.isFinite(f) ? `${(f * 100).toFixed(1)} %` : DASH);

const percent = (f: number | null): string => {
  if (f === null || !Number.isFinite(f)) return DASH;
  const p = f * 100;
  return `${p >= 0 ? '+' : ''}${p.toFixed(1)} %`;
};

type ConditionKey = keyof Conditions;
type Quantity = 'length' | 'pressure' | 'temperature' | 'fraction' | 'ratio' | 'text';

/** Labels of the design-condition fields, in the order they print. */
const CONDITION_FIELDS: readonly { key: ConditionKey; label: string; q: Quantity }[] = [
  { key: 'pressure', label: 'Internal design pressure P', q: 'pressure' },
  { key: 'temperature', label: 'Design temperature', q: 'temperature' },
  { key: 'externalPressure', label: 'External design pressure', q: 'pressure' },
  { key: 'material', label: 'Material', q: 'text' },
  { key: 'allowableStress', label: 'Allowable stress S (given)', q: 'pressure' },
  { key: 'productForm', label: 'Product form / longitudinal joint', q: 'text' },
  { key: 'qualityFactor', label: 'Quality factor E (given)', q: 'ratio' },
  {
    key: 'weldStrengthFactor',
    label: 'Weld joint strength reduction factor W (given)',
    q: 'ratio',
  },
  { key: 'coefficientY', label: 'Coefficient Y (given)', q: 'ratio' },
  { key: 'corrosionAllowance', label: 'Corrosion / erosion allowance c', q: 'length' },
  { key: 'millTolerance', label: 'Mill under-tolerance', q: 'fraction' },
  { key: 'millToleranceLength', label: 'Mill under-tolerance (fixed)', q: 'length' },
  { key: 'grooveDepth', label: 'Thread or groove depth', q: 'length' },
  { key: 'stiffenedLength', label: 'Design length L between stiffeners', q: 'length' },
  { key: 'yieldStrength', label: 'Yield strength Sy (given)', q: 'pressure' },
  { key: 'elasticModulus', label: 'Elastic modulus (given)', q: 'pressure' },
];

/** Spool-wide values the engine looks up or defaults (shown once, with their sources). */
const DERIVED_SYMBOLS = new Set([
  'S',
  'E',
  'W',
  'Y',
  'tol',
  'c_a',
  'S_y',
  'E_y',
  'L',
  'P_ext',
  'h',
  'g',
]);

const CONDITIONS_SOURCE = 'spool design conditions (as entered)';

function formatCondition(value: unknown, q: Quantity, units: SpoolDocument['units']): string {
  const u = UNIT_LABELS[units];
  if (typeof value !== 'number') return String(value);
  switch (q) {
    case 'length':
      return `${fmt(value)} ${u.length}`;
    case 'pressure':
      return `${fmt(value)} ${u.pressure}`;
    case 'temperature':
      return `${fmt(value)} ${u.temperature}`;
    case 'fraction':
      return `${fmt(value)} (${fmt(value * 100)} %)`;
    default:
      return fmt(value);
  }
}

function sizeOf(el: SpoolElement | undefined, e: ElementCheck, lengthUnit: string): string {
  if (!el) return DASH;
  const size =
    el.nps !== undefined
      ? `NPS ${String(el.nps)}`
      : `D ${withUnit(el.outsideDiameter ?? el.insideDiameter ?? e.outsideDiameter, lengthUnit)}`;
  const wall =
    el.schedule !== undefined
      ? `Sch ${String(el.schedule)}`
      : `T ${withUnit(el.nominalWall ?? e.nominalWall, lengthUnit)}`;
  return `${size} / ${wall}`;
}

function describeElement(
  el: SpoolElement | undefined,
  e: ElementCheck,
  lengthUnit: string,
): string {
  const parts = [sizeOf(el, e, lengthUnit)];
  if (e.outsideDiameter > 0)
    parts.push(
      `D ${withUnit(e.outsideDiameter, lengthUnit)}`,
      `T ${withUnit(e.nominalWall, lengthUnit)}`,
    );
  if (el?.kind === 'bend') {
    const r = e.inputs.find((i) => i.symbol === 'R1');
    const given = typeof el.bendRadius === 'number' ? '' : ` (${fmt(el.bendRadius.multipleOfD)}D)`;
    parts.push(
      `R1 ${r ? withUnit(r.value, r.unit) : typeof el.bendRadius === 'number' ? withUnit(el.bendRadius, lengthUnit) : DASH}${given}`,
      `${fmt(el.angle)}°`,
    );
  } else if (el?.kind === 'straight') {
    parts.push(`length ${withUnit(el.length, lengthUnit)}`);
    if (el.endType) parts.push(`${el.endType} ends`);
  }
  if (el?.tag) parts.push(`tag ${el.tag}`);
  return parts.join(' · ');
}

function trailStep(s: TrailStep): SheetTrailStep {
  return {
    label: s.label,
    equation: s.equation,
    formula: s.formula,
    substituted: s.substituted,
    result: `${s.symbol} = ${withUnit(s.value, s.unit)}`,
  };
}

function sheetCase(
  c: CaseResult,
  governing: string | null,
  u: { length: string; pressure: string },
): SheetCase {
  return {
    location: caseLabelOf(c.case),
    equation: c.equation,
    I: c.I === undefined ? DASH : fmt(c.I),
    t: withUnit(c.t, u.length),
    tm: withUnit(c.tm, u.length),
    orderedWall: withUnit(c.requiredNominalWall, u.length),
    allowablePressure:
      c.allowablePressure === undefined ? DASH : withUnit(c.allowablePressure, u.pressure),
    governing: c.case === governing,
  };
}

function sheetInput(i: SourcedValue): SheetInput {
  return {
    symbol: i.symbol,
    label: i.label,
    value: withUnit(i.value, i.unit),
    source: i.source,
    fromMemory: i.fromMemory === true,
  };
}

function buildElement(
  e: ElementCheck,
  el: SpoolElement | undefined,
  units: SpoolDocument['units'],
): SheetElement {
  const u = UNIT_LABELS[units];
  const governingCase = e.cases.find((c) => c.case === e.governing);
  const figures: SheetRow[] = [
    { label: 'governing case', value: caseLabelOf(e.governing), source: governingCase?.equation },
    {
      label: 'pressure design thickness t',
      value: withUnit(governingCase?.t, u.length),
      source: governingCase?.equation,
    },
    {
      label: 'minimum required thickness tm = t + c',
      value: withUnit(governingCase?.tm, u.length),
      source: 'B31.3 Eq. (2)',
    },
    {
      label: 'ordered nominal wall needed',
      value: withUnit(e.requiredNominalWall, u.length),
      strong: true,
    },
    { label: 'chosen nominal wall', value: withUnit(e.nominalWall, u.length) },
    {
      label: 'chosen minimum wall (after mill tolerance)',
      value: withUnit(e.minimumWall, u.length),
    },
    { label: 'margin on the ordered wall', value: percent(e.margin) },
    { label: 'MAWP of the chosen wall', value: withUnit(e.mawp, u.pressure) },
  ];
  const ext = e.cases.find((c) => c.allowablePressure !== undefined);
  if (ext?.allowablePressure !== undefined) {
    figures.push({
      label: 'allowable external pressure (lower of the two below)',
      value: withUnit(ext.allowablePressure, u.pressure),
      source: ext.allowableBasis ? EXTERNAL_BASIS_LABEL[ext.allowableBasis] : undefined,
    });
    if (ext.allowableUg28 !== undefined)
      figures.push({
        label: 'by VIII-1 UG-28',
        value: withUnit(ext.allowableUg28, u.pressure),
        source: 'from memory',
      });
    if (ext.allowableVIII2 !== undefined)
      figures.push({
        label: 'by VIII-2 4.4.5.1',
        value: withUnit(ext.allowableVIII2, u.pressure),
        source: 'from memory',
      });
  }
  figures.push({
    label: 'lightest passing schedule',
    value: e.lightest?.label ?? e.lightestSchedule ?? 'none listed passes',
  });
  if (e.preBendWall !== undefined)
    figures.push({
      label: 'wall before bending (ordered)',
      value: withUnit(e.preBend?.requiredOrderedWall ?? e.preBendWall, u.length),
    });

  const p = e.preBend;
  const preBend: SheetRow[] | null = p
    ? [
        { label: 'R1 / D (nominal size)', value: fmt(p.radiusRatio) },
        {
          label: 'table factor',
          value: p.tableFactor === null ? 'outside table' : fmt(p.tableFactor),
          source: 'B31.1 Table 102.4.5',
        },
        { label: 'wall by table factor', value: withUnit(p.tableWall, u.length) },
        { label: 'extrados thinning (geometric)', value: share(p.extradosThinning) },
        { label: 'intrados thickening (geometric)', value: share(p.intradosThickening) },
        {
          label: 'expected wall after bending, extrados',
          value: withUnit(p.expectedExtradosWall, u.length),
        },
        {
          label: 'expected wall after bending, intrados',
          value: withUnit(p.expectedIntradosWall, u.length),
        },
        {
          label: 'wall by geometric estimate',
          value: withUnit(p.geometricWall, u.length),
          source: 'geometric estimate (common practice)',
        },
        {
          label: 'ordered wall needed before bending',
          value: withUnit(p.requiredOrderedWall, u.length),
          strong: true,
        },
        {
          label: 'order',
          value: p.orderHeavier
            ? `ORDER HEAVIER: schedule ${p.orderSchedule ?? 'none listed'}`
            : 'chosen schedule is enough',
          strong: p.orderHeavier,
        },
      ]
    : null;

  const ordered = governingCase
    ? [governingCase, ...e.cases.filter((c) => c !== governingCase)]
    : [...e.cases];
  const trail: SheetTrailGroup[] = ordered.map((c) => ({
    title: `${caseLabelOf(c.case)}${c === governingCase ? ' (governing)' : ''}`,
    governing: c === governingCase,
    steps: c.trail.map(trailStep),
  }));
  if (p && p.trail.length > 0)
    trail.push({ title: 'wall before bending', governing: false, steps: p.trail.map(trailStep) });

  const inputs = e.inputs.map(sheetInput);
  return {
    id: e.id,
    kind: e.kind,
    title: `${e.kind === 'bend' ? 'Bend' : 'Straight'} ${e.id}`,
    status: e.status,
    statusLabel: e.status.toUpperCase(),
    description: describeElement(el, e, u.length),
    governing: caseLabelOf(e.governing),
    figures,
    cases: e.cases.map((c) => sheetCase(c, e.governing, u)),
    preBend,
    messages: e.messages.map((m) => ({ level: m.level, text: m.text })),
    issues: e.inputIssues.map((i) => `${i.path}: ${i.message}`),
    trail,
    inputs,
    fromMemoryCount: inputs.filter((i) => i.fromMemory).length,
  };
}

/** Build the calc sheet of one spool revision from its document, full check and history. */
export function buildCalcSheet(input: CalcSheetInput): CalcSheet {
  const { document: doc, check } = input;
  const u = UNIT_LABELS[doc.units];
  const spoolName = doc.name?.trim() || 'Unnamed spool';
  const revisionLabel =
    input.revision === null
      ? 'no revision'
      : `rev. ${input.revision}${input.state ? ` · ${input.state}` : ''}`;
  const generated = formatUtc(input.generatedAt);

  const identity: SheetRow[] = [
    { label: 'Team', value: input.team ?? DASH },
    { label: 'Spool', value: spoolName },
    { label: 'Line', value: doc.line?.trim() || DASH },
    { label: 'Revision', value: input.revision === null ? DASH : String(input.revision) },
    { label: 'State', value: input.state ?? DASH },
    { label: 'Units', value: `${doc.units} (${u.length}, ${u.pressure}, ${u.temperature})` },
    { label: 'Elements', value: String(check.elements.length) },
    { label: 'Checked and generated', value: generated },
  ];
  if (input.origin) identity.push({ label: 'Copy', value: input.origin });

  const conditions: SheetRow[] = [];
  for (const f of CONDITION_FIELDS) {
    const v = doc.conditions[f.key];
    if (v === undefined) continue;
    conditions.push({
      label: f.label,
      value: formatCondition(v, f.q, doc.units),
      source: CONDITIONS_SOURCE,
    });
  }

  // Values the engine looked up or defaulted, taken from the first checked element that keeps
  // the spool conditions (elements with overrides list their own under their inputs).
  const plain = check.elements.find(
    (e) => e.status !== 'invalid' && !doc.elements[e.index]?.conditions,
  );
  const derived: SheetRow[] = (plain?.inputs ?? [])
    .filter((i) => DERIVED_SYMBOLS.has(i.symbol) && !i.source.startsWith('spool conditions'))
    .map((i) => ({
      label: `${i.symbol}: ${i.label}`,
      value: withUnit(i.value, i.unit),
      source: i.source,
      fromMemory: i.fromMemory === true,
    }));

  const elements = check.elements.map((e) => buildElement(e, doc.elements[e.index], doc.units));
  const s = check.summary;
  const parts = [
    `${s.pass} pass`,
    `${s.marginal} marginal`,
    `${s.fail} fail`,
    `${s.review} review`,
  ];
  if (s.invalid > 0) parts.push(`${s.invalid} not checkable`);
  const summary = `${parts.join(' · ')}. Worst: ${check.worst ? check.worst.toUpperCase() : DASH}. Marginal = passing with less than 10 % margin on the ordered nominal wall.`;

  const overview: SheetOverviewRow[] = check.elements.map((e) => ({
    id: e.id,
    kind: e.kind,
    size: sizeOf(doc.elements[e.index], e, u.length),
    governing: caseLabelOf(e.governing),
    orderedWall: withUnit(e.requiredNominalWall, u.length),
    chosenWall: withUnit(e.nominalWall, u.length),
    margin: percent(e.margin),
    status: e.status.toUpperCase(),
  }));

  const history: SheetEvent[] = input.history
    .filter((h) => input.revision === null || h.revision === input.revision)
    .map((h) => ({
      when: formatUtc(h.createdAt),
      move: MOVE_LABELS[`${h.from}>${h.to}`] ?? `${h.from} to ${h.to}`,
      who: h.user?.name || DASH,
      note: h.note ?? '',
    }));

  const fromMemoryCount =
    elements.reduce((n, e) => n + e.fromMemoryCount, 0) +
    derived.filter((d) => d.fromMemory).length;
  return {
    title: CALC_SHEET_TITLE,
    spoolName,
    revisionLabel,
    runningHeader: `${spoolName} · ${doc.line?.trim() || 'no line'} · ${revisionLabel}`,
    identity,
    conditions,
    derived,
    summary,
    overview,
    elements,
    history,
    historyNote:
      history.length > 0
        ? ''
        : (input.historyNote ??
          'No submissions, checks or releases are recorded for this revision yet.'),
    fromMemoryCount,
    caution: check.caution || CAUTION,
    units: doc.units,
  };
}
