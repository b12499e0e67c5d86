import type { FieldIssue, SpoolDocument, SpoolElement } from '../model/spool';
import type {
  CaseName,
  CaseResult,
  CheckMessage,
  CheckStatus,
  ElementCheck,
  ElementFigures,
  PreBendFigures,
  PreBendResult,
  ScheduleChoice,
  TrailStep,
} from './types';
import { preBendFactorValue } from '../data/code-tables';
import { listScheduleChoices } from '../data/pipe-dimensions';
import { UNIT_LABELS } from '../units/units';
import {
  bendThickness,
  extradosFactor,
  intradosFactor,
  pressureForThickness,
  straightThickness,
  straightThicknessFromId,
  thickWallY,
} from './equations';
import { EXTERNAL_BASIS_LABEL, externalAllowable, minimumExternalWall } from './external';
import { fmt } from './format';
import type { MaterialFinder, ResolveCache, ResolvedElement } from './resolve';
import { resolveElement } from './resolve';

/**
 * Every message code, in the order messages appear in a result (each code has one place in that
 * order, so "unique codes in order of appearance" is this order filtered).
 */
export const MESSAGE_CODES = [
  'input',
  'material-vs-spool-stress',
  'below-min-temperature',
  'product-form',
  'w-rule',
  'w-assumed',
  'tight-bend',
  'yield-lower-bound',
  'long-cylinder',
  'special-consideration',
  'wall-short',
  'marginal',
  'external-allowable',
  'no-schedule',
  'order-heavier',
  'pre-bend-table',
  'flattening',
  'from-memory',
] as const;
export type MessageCode = (typeof MESSAGE_CODES)[number];
const CODE_BIT = new Map<string, number>(MESSAGE_CODES.map((c, i) => [c, 1 << i]));
const bit = (code: MessageCode): number => CODE_BIT.get(code) ?? 0;
const BIT = {
  special: bit('special-consideration'),
  wallShort: bit('wall-short'),
  marginal: bit('marginal'),
  external: bit('external-allowable'),
  noSchedule: bit('no-schedule'),
  orderHeavier: bit('order-heavier'),
  preBendTable: bit('pre-bend-table'),
  flattening: bit('flattening'),
  fromMemory: bit('from-memory'),
};
const CODE_LISTS = new Map<number, readonly string[]>();
/** The codes of a mask as one shared, frozen list (no allocation once seen). */
function codesOf(mask: number): readonly string[] {
  let list = CODE_LISTS.get(mask);
  if (!list) {
    list = Object.freeze(MESSAGE_CODES.filter((_, i) => (mask & (1 << i)) !== 0));
    CODE_LISTS.set(mask, list);
  }
  return list;
}

/** Margin on the ordered wall below which a passing element is `marginal` (10 %). */
export const MARGINAL_LIMIT = 0.1;
/** P/(S·E) above which para. 304.1.2(b) asks for special consideration. */
const PSE_LIMIT = 0.385;

const EQ = {
  a: 'B31.3 Eq. (3a)',
  b: 'B31.3 Eq. (3b)',
  c: 'B31.3 Eq. (3c)',
  d: 'B31.3 Eq. (3d)',
  e: 'B31.3 Eq. (3e)',
  tm: 'B31.3 Eq. (2)',
  tol: 'mill under-tolerance (ASTM A530/A999)',
  ext: 'B31.3 304.1.3 → VIII-1 UG-28; allowable = min(UG-28, VIII-2 4.4.5.1) (from memory)',
} as const;

/**
 * Evaluation context. `full` builds the trail and message texts (what people read); without it
 * only numbers and message codes are produced (the numbers-first path). Both run this same code.
 */
interface Ctx {
  readonly r: ResolvedElement;
  readonly metric: boolean;
  readonly lu: string;
  readonly pu: string;
  readonly full: boolean;
}

/** Ordered nominal wall needed for a minimum wall tm: tm/(1 − tol), or tm + a fixed under-tolerance. */
function orderedWall(r: ResolvedElement, tm: number): number {
  return r.tolLength !== null ? tm + r.tolLength : tm / (1 - (r.tolFraction ?? 0));
}

/** Minimum wall of a nominal wall T after mill under-tolerance. */
function minimumWallOf(r: ResolvedElement, T: number): number {
  return r.tolLength !== null ? T - r.tolLength : T * (1 - (r.tolFraction ?? 0));
}

function pushTmAndOrdered(
  ctx: Ctx,
  t: number,
  tm: number,
  ordered: number,
  trail: TrailStep[],
): void {
  const { r, lu } = ctx;
  trail.push({
    equation: EQ.tm,
    label: 'minimum required thickness',
    formula: 'tm = t + c',
    substituted: `tm = ${fmt(t)} + ${fmt(r.c)}`,
    symbol: 'tm',
    value: tm,
    unit: lu,
  });
  trail.push(
    r.tolLength !== null
      ? {
          equation: EQ.tol,
          label: 'ordered nominal wall needed',
          formula: 'T ≥ tm + under-tolerance',
          substituted: `T ≥ ${fmt(tm)} + ${fmt(r.tolLength)}`,
          symbol: 'T_req',
          value: ordered,
          unit: lu,
        }
      : {
          equation: EQ.tol,
          label: 'ordered nominal wall needed',
          formula: 'T ≥ tm / (1 − tol)',
          substituted: `T ≥ ${fmt(tm)} / (1 − ${fmt(r.tolFraction ?? 0)})`,
          symbol: 'T_req',
          value: ordered,
          unit: lu,
        },
  );
}

interface InternalCase {
  readonly result: CaseResult;
  readonly I: number;
  readonly t: number;
  /** Y actually used (thick-wall corrected where t ≥ D/6). */
  readonly yUsed: number;
  /** t ≥ D/6 (para. 304.1.2(b)). */
  readonly thick: boolean;
  /** The thick-wall Y was applied (then the requirement depends on the wall T). */
  readonly thickY: boolean;
  /** P/(S·E) > 0.385. */
  readonly pse: boolean;
  readonly nonFinite: boolean;
}

/** t at one location: Eq. (3b) from an explicit ID, (3a) for straight pipe, (3c) with I for a bend. */
function thicknessAt(
  r: ResolvedElement,
  useId: boolean,
  D: number,
  I: number | undefined,
  y: number,
): number {
  if (useId) return straightThicknessFromId(r.P, r.d ?? 0, r.c, r.S, r.E, r.W, y);
  return I === undefined
    ? straightThickness(r.P, D, r.S, r.E, r.W, y)
    : bendThickness(r.P, D, r.S, r.E, r.W, y, I);
}

function pushThickness(
  ctx: Ctx,
  trail: TrailStep[],
  name: CaseName,
  useId: boolean,
  D: number,
  I: number | undefined,
  y: number,
  tv: number,
  note: string,
): void {
  const { r, lu } = ctx;
  const { P, S, E, W } = r;
  if (useId) {
    trail.push({
      equation: EQ.b,
      label: `pressure design thickness t${note}`,
      formula: 't = P·(d + 2c) / (2·[S·E·W − P·(1 − Y)])',
      substituted: `t = ${fmt(P)} × (${fmt(r.d ?? 0)} + 2 × ${fmt(r.c)}) / (2 × [${fmt(S)} × ${fmt(E)} × ${fmt(W)} − ${fmt(P)} × (1 − ${fmt(y)})])`,
      symbol: 't',
      value: tv,
      unit: lu,
    });
  } else if (I === undefined) {
    trail.push({
      equation: EQ.a,
      label: `pressure design thickness t${note}`,
      formula: 't = P·D / (2·(S·E·W + P·Y))',
      substituted: `t = ${fmt(P)} × ${fmt(D)} / (2 × (${fmt(S)} × ${fmt(E)} × ${fmt(W)} + ${fmt(P)} × ${fmt(y)}))`,
      symbol: 't',
      value: tv,
      unit: lu,
    });
  } else {
    trail.push({
      equation: EQ.c,
      label: `pressure design thickness t at the ${name}${note}`,
      formula: 't = P·D / (2·[(S·E·W / I) + P·Y])',
      substituted: `t = ${fmt(P)} × ${fmt(D)} / (2 × [(${fmt(S)} × ${fmt(E)} × ${fmt(W)} / ${fmt(I)}) + ${fmt(P)} × ${fmt(y)}])`,
      symbol: 't',
      value: tv,
      unit: lu,
    });
  }
}

/** Internal pressure at one location: straight (I = 1, Eq. 3a or 3b) or a bend location (Eq. 3c with I). */
function internalCase(
  ctx: Ctx,
  name: CaseName,
  D: number,
  T: number,
  I: number | undefined,
): InternalCase {
  const { r, full } = ctx;
  const trail: TrailStep[] | null = full ? [] : null;
  let Y = r.Y;
  const useId = name === 'straight' && r.d !== null;
  if (trail && I !== undefined) {
    trail.push({
      equation: name === 'intrados' ? EQ.d : name === 'extrados' ? EQ.e : 'B31.3 para. 304.2.1',
      label: `bend factor I at the ${name}`,
      formula:
        name === 'intrados'
          ? 'I = (4·(R1/D) − 1) / (4·(R1/D) − 2)'
          : name === 'extrados'
            ? 'I = (4·(R1/D) + 1) / (4·(R1/D) + 2)'
            : 'I = 1.0 at the sidewall (bend centreline)',
      substituted:
        name === 'sidewall'
          ? 'I = 1'
          : `I = (4 × ${fmt((r.bend?.R1 ?? 0) / D)} ${name === 'intrados' ? '− 1' : '+ 1'}) / (4 × ${fmt((r.bend?.R1 ?? 0) / D)} ${name === 'intrados' ? '− 2' : '+ 2'})`,
      symbol: 'I',
      value: I,
      unit: '',
    });
  }
  let t = thicknessAt(r, useId, D, I, Y);
  const equation = useId ? EQ.b : I === undefined ? EQ.a : EQ.c;
  if (trail) pushThickness(ctx, trail, name, useId, D, I, Y, t, '');
  const thick = t >= D / 6;
  let thickY = false;
  const t0 = t;
  if (thick && !r.yOverridden) {
    const d = D - 2 * T;
    Y = thickWallY(D, d, r.c);
    thickY = true;
    if (trail)
      trail.push({
        equation: 'B31.3 Table 304.1.1 note',
        label: 'coefficient Y for t ≥ D/6',
        formula: 'Y = (d + 2c) / (D + d + 2c)',
        substituted: `Y = (${fmt(d)} + 2 × ${fmt(r.c)}) / (${fmt(D)} + ${fmt(d)} + 2 × ${fmt(r.c)})`,
        symbol: 'Y',
        value: Y,
        unit: '',
      });
    t = thicknessAt(r, useId, D, I, Y);
    if (trail) pushThickness(ctx, trail, name, useId, D, I, Y, t, ' (thick-wall Y)');
  }
  const pse = r.P / (r.S * r.E) > PSE_LIMIT;
  const nonFinite = !Number.isFinite(t);
  const tm = t + r.c;
  const ordered = orderedWall(r, tm);
  if (trail) pushTmAndOrdered(ctx, t, tm, ordered, trail);
  // The numbers-only path builds the same object without `trail` (it is only read as figures).
  let result: CaseResult;
  if (trail)
    result =
      I !== undefined
        ? { case: name, I, t, tm, requiredNominalWall: ordered, equation, trail }
        : { case: name, t, tm, requiredNominalWall: ordered, equation, trail };
  else
    result = (
      I !== undefined
        ? { case: name, I, t, tm, requiredNominalWall: ordered, equation }
        : { case: name, t, tm, requiredNominalWall: ordered, equation }
    ) as CaseResult;
  // t before the thick-wall correction is what the D/6 message quotes.
  return { result, I: I ?? 1, t: thick ? t0 : t, yUsed: Y, thick, thickY, pse, nonFinite };
}

/** External pressure: minimum effective wall holding Pext, and the allowable of the chosen wall. */
function externalCase(ctx: Ctx, D: number, T: number): CaseResult | null {
  const { r, lu, pu, full } = ctx;
  const ext = r.external;
  if (!ext || r.Pext <= 0) return null;
  const trail: TrailStep[] | null = full ? [] : null;
  // The minimum wall is a pure function of (D, L) and the conditions: solved once per run for each.
  const memo = r.externalWalls;
  let t: number;
  const key = D * 1e6 + ext.L;
  const hit = memo?.get(key);
  if (hit !== undefined && hit[0] === D && hit[1] === ext.L) t = hit[2];
  else {
    t = minimumExternalWall(D, r.Pext, ext.L, ext.Ey, ext.Sy, r.S);
    memo?.set(key, [D, ext.L, t]);
  }
  const atMin = externalAllowable(D, t, ext.L, ext.Ey, ext.Sy, r.S);
  const tm = t + r.c;
  const ordered = orderedWall(r, tm);
  if (trail) {
    trail.push({
      equation: 'VIII-1 UG-28 (from memory)',
      label: 'geometric factor A at the minimum wall',
      formula:
        D / t < 4
          ? 'A = 1.1/(Do/t)² (UG-28(c)(2), Do/t < 4)'
          : 'A = max(1.1/(Do/t)², 1.30·(t/Do)^1.5 / (L/Do − 0.45·(t/Do)^0.5)), L/Do ≤ 50',
      substituted: `Do/t = ${fmt(D / t)}, L/Do = ${fmt(Math.min(ext.L / D, 50))}`,
      symbol: 'A',
      value: atMin.A,
      unit: '',
    });
    trail.push({
      equation: 'VIII-1 UG-28 / VIII-2 4.4.5.1 (from memory)',
      label: `minimum effective wall for external pressure (${EXTERNAL_BASIS_LABEL[atMin.basis]} governs)`,
      formula: 'smallest t with Pa(t) = min(Pa_UG-28, Pa_VIII-2) ≥ P_ext',
      substituted: `Pa(${fmt(t)}) = min(${fmt(atMin.PaUg28)}, ${fmt(atMin.PaVIII2)}) = ${fmt(atMin.Pa)} ${pu} ≥ ${fmt(r.Pext)} ${pu}`,
      symbol: 't',
      value: t,
      unit: lu,
    });
    pushTmAndOrdered(ctx, t, tm, ordered, trail);
  }
  const tEff = minimumWallOf(r, T) - r.c;
  let allowablePressure = 0;
  let allowableUg28 = 0;
  let allowableVIII2 = 0;
  let allowableBasis = atMin.basis;
  if (tEff > 0) {
    const a = externalAllowable(D, tEff, ext.L, ext.Ey, ext.Sy, r.S);
    allowablePressure = a.Pa;
    allowableUg28 = a.PaUg28;
    allowableVIII2 = a.PaVIII2;
    allowableBasis = a.basis;
    if (trail) {
      const ratio = D / tEff;
      trail.push({
        equation: 'VIII-1 UG-28',
        label: 'chosen wall: effective thickness',
        formula: 't_e = T·(1 − tol) − c',
        substituted: `t_e = ${fmt(minimumWallOf(r, T))} − ${fmt(r.c)}`,
        symbol: 't_e',
        value: tEff,
        unit: lu,
      });
      trail.push({
        equation: 'VIII-1 UG-28 (from memory)',
        label: 'chosen wall: geometric factor A',
        formula: ratio < 4 ? 'A = 1.1/(Do/t)² (UG-28(c)(2), Do/t < 4)' : 'A (as above)',
        substituted: `Do/t = ${fmt(ratio)}`,
        symbol: 'A',
        value: a.A,
        unit: '',
      });
      if (ratio >= 10) {
        trail.push({
          equation: 'VIII-1 UG-28(c)(1) elastic (from memory)',
          label: 'chosen wall: UG-28 allowable, elastic range (B = A·E/2)',
          formula: 'Pa = 4·B/(3·(Do/t)) = 2·A·E / (3·(Do/t))',
          substituted: `Pa = 2 × ${fmt(a.A)} × ${fmt(ext.Ey)} / (3 × ${fmt(ratio)})`,
          symbol: 'Pa_UG28',
          value: a.PaUg28,
          unit: pu,
        });
      } else {
        trail.push({
          equation: 'VIII-1 UG-28(c)(2) (from memory)',
          label: 'chosen wall: UG-28 allowable, Do/t < 10',
          formula:
            'Pa = min([2.167/(Do/t) − 0.0833]·B, [2S/(Do/t)]·[1 − 1/(Do/t)]), B = A·E/2, S = min(1.5·S, 0.9·Sy)',
          substituted: `Pa = min(${fmt(a.PaElastic)}, ${fmt(a.PaThick ?? 0)})`,
          symbol: 'Pa_UG28',
          value: a.PaUg28,
          unit: pu,
        });
      }
      trail.push({
        equation: 'VIII-2 4.4.5.1 (from memory)',
        label: 'elastic hoop buckling stress',
        formula: 'Mx = L/√(Ro·t); Ch per Mx; Fhe = 1.6·Ch·Ey·t/Do',
        substituted: `Mx = ${fmt(a.Mx)}, Ch = ${fmt(a.Ch)}, Fhe = 1.6 × ${fmt(a.Ch)} × ${fmt(ext.Ey)} × ${fmt(tEff)} / ${fmt(D)}`,
        symbol: 'Fhe',
        value: a.Fhe,
        unit: pu,
      });
      trail.push({
        equation: 'VIII-2 4.4.5.1 (from memory)',
        label: 'predicted buckling stress and design factor',
        formula: 'Fic from Fhe/Sy; FS = 2.0 … 1.667; Fha = Fic/FS',
        substituted: `Fic = ${fmt(a.Fic)}, FS = ${fmt(a.FS)}, Fha = ${fmt(a.Fha)}`,
        symbol: 'Fha',
        value: a.Fha,
        unit: pu,
      });
      trail.push({
        equation: 'VIII-2 4.4.5.1 (from memory)',
        label: 'chosen wall: VIII-2 allowable',
        formula: 'Pa = 2·Fha·(t/Do)',
        substituted: `Pa = 2 × ${fmt(a.Fha)} × ${fmt(tEff)} / ${fmt(D)}`,
        symbol: 'Pa_VIII2',
        value: a.PaVIII2,
        unit: pu,
      });
      trail.push({
        equation: 'B31.3 304.1.3 (from memory)',
        label: `allowable external pressure of the chosen wall (${EXTERNAL_BASIS_LABEL[a.basis]} governs)`,
        formula: 'Pa = min(Pa_UG28, Pa_VIII2)',
        substituted: `Pa = min(${fmt(a.PaUg28)}, ${fmt(a.PaVIII2)})`,
        symbol: 'Pa',
        value: a.Pa,
        unit: pu,
      });
    }
  }
  const figures = {
    case: 'external' as const,
    t,
    tm,
    requiredNominalWall: ordered,
    allowablePressure,
    allowableUg28,
    allowableVIII2,
    allowableBasis,
    minimumWallBasis: atMin.basis,
    equation: EQ.ext,
  };
  return trail ? { ...figures, trail } : (figures as CaseResult);
}

interface Requirement {
  readonly cases: CaseResult[];
  readonly internal: InternalCase[];
  readonly governing: CaseResult | undefined;
  readonly required: number;
  /** Any location needed the thick-wall Y, so the requirement depends on T. */
  readonly dependsOnT: boolean;
}

/** Required ordered nominal wall over all cases for a pipe of diameter D and wall T. */
function requirementFor(ctx: Ctx, D: number, T: number): Requirement {
  const { r } = ctx;
  const internal: InternalCase[] = [];
  if (r.bend) {
    const ratio = r.bend.R1 / D;
    internal.push(internalCase(ctx, 'intrados', D, T, intradosFactor(ratio)));
    internal.push(internalCase(ctx, 'extrados', D, T, extradosFactor(ratio)));
    internal.push(internalCase(ctx, 'sidewall', D, T, 1));
  } else {
    internal.push(internalCase(ctx, 'straight', D, T, undefined));
  }
  const cases: CaseResult[] = [];
  for (const c of internal) cases.push(c.result);
  const ext = externalCase(ctx, D, T);
  if (ext) cases.push(ext);
  let governing: CaseResult | undefined;
  for (const c of cases)
    if (!governing || c.requiredNominalWall > governing.requiredNominalWall + 1e-12) governing = c;
  let dependsOnT = false;
  for (const c of internal) if (c.thickY) dependsOnT = true;
  return { cases, internal, governing, required: governing?.requiredNominalWall ?? 0, dependsOnT };
}

/** A numbers-only context for re-evaluating a candidate pipe. */
function numbersOnly(ctx: Ctx): Ctx {
  return ctx.full ? { r: ctx.r, metric: ctx.metric, lu: ctx.lu, pu: ctx.pu, full: false } : ctx;
}

function scanPassing(
  ctx: Ctx,
  req: Requirement,
  choices: readonly ScheduleChoice[],
): ScheduleChoice | null {
  const { r, metric } = ctx;
  for (const w of choices) {
    const D = metric ? w.odMm : w.odIn;
    const T = metric ? w.wallMm : w.wallIn;
    const needed =
      Math.abs(D - r.D) < 1e-9 && !req.dependsOnT
        ? req.required
        : requirementFor(numbersOnly(ctx), D, T).required;
    if (T >= needed - 1e-12) return w;
  }
  return null;
}

/**
 * The lightest schedule of the element's own standard whose wall passes; a stainless element
 * with no passing B36.19M schedule gets the lightest passing B36.10M wall [ASME B36.10M/B36.19M scope].
 */
function lightestChoice(ctx: Ctx, req: Requirement): ScheduleChoice | null {
  const { r } = ctx;
  if (r.nps === null) return null;
  const own = scanPassing(ctx, req, listScheduleChoices(r.nps, r.standard));
  if (own !== null || !r.stainless || r.standard === 'B36.10M') return own;
  return scanPassing(ctx, req, listScheduleChoices(r.nps, 'B36.10M'));
}

function scanWall(
  metric: boolean,
  choices: readonly ScheduleChoice[],
  wall: number,
): ScheduleChoice | null {
  for (const w of choices) if ((metric ? w.wallMm : w.wallIn) >= wall - 1e-12) return w;
  return null;
}

/** The lightest listed wall (own standard, then B36.10M for stainless) at least `wall` thick. */
function orderChoice(ctx: Ctx, wall: number): ScheduleChoice | null {
  const { r, metric } = ctx;
  if (r.nps === null) return null;
  const own = scanWall(metric, listScheduleChoices(r.nps, r.standard), wall);
  if (own !== null || !r.stainless || r.standard === 'B36.10M') return own;
  return scanWall(metric, listScheduleChoices(r.nps, 'B36.10M'), wall);
}

function preBendFor(
  ctx: Ctx,
  internal: readonly InternalCase[],
  T: number,
): PreBendResult | undefined {
  const { r, lu, full } = ctx;
  if (!r.bend) return undefined;
  const trail: TrailStep[] | null = full ? [] : null;
  const intr = internal[0];
  const ext = internal[1];
  const side = internal[2];
  if (!side || !ext || !intr) return undefined;
  // B31.1 Table 102.4.5 is indexed by R / nominal pipe size; "nD" bends give the multiple exactly.
  const radiusRatio = r.bend.multiple ?? r.bend.R1 / r.bend.nominalSize;
  const tableFactor = preBendFactorValue(radiusRatio);
  const sideTm = side.result.tm;
  const tableWall = tableFactor !== null ? tableFactor * sideTm : null;
  if (trail && tableFactor !== null && tableWall !== null) {
    trail.push({
      equation: 'B31.1 Table 102.4.5',
      label: 'minimum wall before bending (table)',
      formula: 't_before = factor(R/NPS) × tm',
      substituted: `t_before = ${fmt(tableFactor)} × ${fmt(sideTm)}  (R/NPS = ${fmt(radiusRatio)})`,
      symbol: 't_tab',
      value: tableWall,
      unit: lu,
    });
  }
  // Geometric estimate [common practice], as code-tables' geometricThinning (R1/D > 0.5 is assured by resolve).
  const k = (2 * r.bend.R1) / r.D;
  const fExt = k / (k + 1);
  const fInt = k / (k - 1);
  const tmin = minimumWallOf(r, T);
  const expectedExtradosWall = tmin * fExt;
  const expectedIntradosWall = tmin * fInt;
  const geometricWall = Math.max(ext.result.tm / fExt, intr.result.tm / fInt);
  const before = Math.max(geometricWall, tableWall ?? 0);
  const requiredOrderedWall = orderedWall(r, before);
  if (trail) {
    trail.push({
      equation: 'geometric estimate (common practice)',
      label: 'extrados thinning factor',
      formula: 'f_ext = (2R/D) / (2R/D + 1)',
      substituted: `f_ext = ${fmt(k)} / (${fmt(k)} + 1)`,
      symbol: 'f_ext',
      value: fExt,
      unit: '',
    });
    trail.push({
      equation: 'geometric estimate (common practice)',
      label: 'minimum wall before bending (geometric)',
      formula: 't_before = max(tm_ext / f_ext, tm_int / f_int)',
      substituted: `t_before = max(${fmt(ext.result.tm)} / ${fmt(fExt)}, ${fmt(intr.result.tm)} / ${fmt(fInt)})`,
      symbol: 't_geo',
      value: geometricWall,
      unit: lu,
    });
    trail.push({
      equation: EQ.tol,
      label: 'ordered nominal wall for the bend pipe',
      formula: r.tolLength !== null ? 'T ≥ t_before + under-tolerance' : 'T ≥ t_before / (1 − tol)',
      substituted:
        r.tolLength !== null
          ? `T ≥ ${fmt(before)} + ${fmt(r.tolLength)}`
          : `T ≥ ${fmt(before)} / (1 − ${fmt(r.tolFraction ?? 0)})`,
      symbol: 'T_bend',
      value: requiredOrderedWall,
      unit: lu,
    });
  }
  const orderHeavier = T < requiredOrderedWall - 1e-12;
  const order = orderChoice(ctx, requiredOrderedWall);
  const figures = {
    radiusRatio,
    tableFactor,
    tableWall,
    extradosThinning: 1 - fExt,
    intradosThickening: fInt - 1,
    expectedExtradosWall,
    expectedIntradosWall,
    geometricWall,
    requiredOrderedWall,
    orderHeavier,
    orderSchedule: order?.schedule ?? null,
    order,
  };
  // The numbers-only path leaves `trail` out (it is only read as figures).
  return trail ? { ...figures, trail } : (figures as PreBendResult);
}

function invalidResult(el: SpoolElement, index: number, issues: FieldIssue[]): ElementCheck {
  return {
    id: el.id,
    kind: el.kind,
    index,
    status: 'invalid',
    outsideDiameter: 0,
    nominalWall: 0,
    minimumWall: 0,
    requiredNominalWall: 0,
    margin: null,
    governing: null,
    lightestSchedule: null,
    lightest: null,
    mawp: 0,
    cases: [],
    messages: issues.map((i) => ({
      level: 'error' as const,
      code: 'input',
      text: `${i.path}: ${i.message}`,
    })),
    inputs: [],
    inputIssues: issues,
  };
}

/** Everything an element's check computes, before it is shaped as a full result or as figures. */
interface Evaluation {
  readonly status: CheckStatus;
  readonly required: number;
  readonly margin: number | null;
  readonly governing: CaseName | null;
  readonly lightest: ScheduleChoice | null;
  readonly mawp: number;
  readonly cases: CaseResult[];
  readonly preBend: PreBendResult | undefined;
  /** Full path: the messages; numbers-only path: null. */
  readonly messages: CheckMessage[] | null;
  /** Message codes as bits of MESSAGE_CODES. */
  readonly mask: number;
}

function evaluate(ctx: Ctx): Evaluation {
  const { r, lu, pu, full } = ctx;
  const req = requirementFor(ctx, r.D, r.T);
  const { cases, internal } = req;
  const gov = req.governing;
  const required = req.required;
  const messages: CheckMessage[] | null = full ? [] : null;
  let mask = 0;
  for (const n of r.notes) {
    mask |= CODE_BIT.get(n.code) ?? 0;
    if (messages) messages.push({ level: n.level, code: n.code, text: n.text });
  }

  // MAWP of the chosen wall: the lowest internal pressure any location holds.
  const tAvail = minimumWallOf(r, r.T) - r.c;
  let mawp = Number.POSITIVE_INFINITY;
  for (const c of internal)
    mawp = Math.min(mawp, pressureForThickness(tAvail, r.D, r.S, r.E, r.W, c.yUsed, c.I));
  if (!Number.isFinite(mawp)) mawp = 0;

  // Para. 304.1.2(b) special consideration: held for review (numbers are still shown).
  let special = false;
  for (const c of internal) if (c.thick || c.pse || c.nonFinite) special = true;
  const margin = required > 0 ? (r.T - required) / required : null;
  const passes = r.T >= required - 1e-12 && Number.isFinite(required);
  let status: CheckStatus;
  if (special) status = 'review';
  else if (!passes) status = 'fail';
  else if (margin !== null && margin < MARGINAL_LIMIT) status = 'marginal';
  else status = 'pass';
  if (special) {
    mask |= BIT.special;
    if (messages) {
      const texts = new Set<string>();
      for (const c of internal) {
        if (c.thick)
          texts.add(
            `t = ${fmt(c.t)} ${lu} ≥ D/6 = ${fmt(r.D / 6)} ${lu}: para. 304.1.2(b) requires special consideration (failure theory, fatigue, thermal stress)`,
          );
        if (c.pse)
          texts.add(
            `P/(S·E) = ${fmt(r.P / (r.S * r.E))} > ${PSE_LIMIT}: para. 304.1.2(b) requires special consideration`,
          );
        if (c.nonFinite) texts.add('the equation has no finite solution at this pressure');
      }
      for (const text of texts)
        messages.push({ level: 'warning', code: 'special-consideration', text });
    }
  }
  if (status === 'review' && !passes) {
    mask |= BIT.wallShort;
    if (messages)
      messages.push({
        level: 'error',
        code: 'wall-short',
        text: `the chosen wall ${fmt(r.T)} ${lu} is also below the ${fmt(required)} ${lu} needed`,
      });
  }
  if (status === 'fail') {
    mask |= BIT.wallShort;
    if (messages)
      messages.push({
        level: 'error',
        code: 'wall-short',
        text: `nominal wall ${fmt(r.T)} ${lu} < ${fmt(required)} ${lu} needed (${gov?.case ?? ''} governs)`,
      });
  }
  if (status === 'marginal') {
    mask |= BIT.marginal;
    if (messages)
      messages.push({
        level: 'warning',
        code: 'marginal',
        text: `margin on the ordered wall is ${fmt((margin ?? 0) * 100)} % (< ${MARGINAL_LIMIT * 100} %)`,
      });
  }
  const ext = cases.length > internal.length ? cases[cases.length - 1] : undefined;
  if (ext?.allowablePressure !== undefined) {
    mask |= BIT.external;
    if (messages) {
      messages.push({
        level: 'info',
        code: 'external-allowable',
        text: `allowable external pressure of the chosen wall: ${fmt(ext.allowablePressure)} ${pu} = min(UG-28 ${fmt(ext.allowableUg28 ?? 0)} ${pu}, VIII-2 4.4.5.1 ${fmt(ext.allowableVIII2 ?? 0)} ${pu}); ${EXTERNAL_BASIS_LABEL[ext.allowableBasis ?? 'ug28-elastic']} governs — formulas recalled from memory, verify`,
      });
    }
  }

  // Lightest passing schedule of the element's own standard (also for review elements).
  let lightest: ScheduleChoice | null = null;
  if (r.nps !== null) {
    lightest = lightestChoice(ctx, req);
    if (lightest === null) {
      mask |= BIT.noSchedule;
      if (messages)
        messages.push({
          level: 'error',
          code: 'no-schedule',
          text: `no listed schedule of NPS ${r.nps} in ASME ${r.standard}${r.stainless && r.standard === 'B36.19M' ? ' or B36.10M' : ''} gives the wall needed`,
        });
    }
  }

  const preBend = preBendFor(ctx, internal, r.T);
  if (preBend) {
    if (preBend.orderHeavier) {
      mask |= BIT.orderHeavier;
      if (messages)
        messages.push({
          level: 'warning',
          code: 'order-heavier',
          text: `order the bend pipe heavier: ${fmt(preBend.requiredOrderedWall)} ${lu} nominal needed before bending${preBend.order ? ` (schedule ${preBend.order.label})` : ''}`,
        });
    }
    if (preBend.tableFactor === null) {
      mask |= BIT.preBendTable;
      if (messages)
        messages.push({
          level: 'info',
          code: 'pre-bend-table',
          text: `R/NPS = ${fmt(preBend.radiusRatio)} is below the 3D start of B31.1 Table 102.4.5: geometric estimate only`,
        });
    }
  }
  if (r.bend) {
    mask |= BIT.flattening;
    if (messages)
      messages.push({
        level: 'info',
        code: 'flattening',
        text: 'flattening (max OD − min OD) must not exceed 8 % of nominal OD for internal pressure, 3 % for external (para. 332.2.1, from memory): verify at fabrication',
      });
  }
  if (r.memorySymbols.length > 0) {
    mask |= BIT.fromMemory;
    if (messages)
      messages.push({
        level: 'warning',
        code: 'from-memory',
        text: `uses values recalled from memory (${r.memorySymbols.join(', ')}): verify against the licensed edition`,
      });
  }
  return {
    status,
    required,
    margin,
    governing: gov?.case ?? null,
    lightest,
    mawp,
    cases,
    preBend,
    messages,
    mask,
  };
}

function contextFor(doc: SpoolDocument, r: ResolvedElement, full: boolean): Ctx {
  const u = UNIT_LABELS[doc.units];
  return { r, metric: doc.units === 'metric', lu: u.length, pu: u.pressure, full };
}

/**
 * Check one element with its full trail: every pressure case, the governing ordered wall, MAWP,
 * status, the lightest passing schedule and (bends) the wall needed before bending, with the
 * equation trail, the inputs and their sources and the message texts. Never throws for rule violations.
 */
export function checkElement(
  doc: SpoolDocument,
  el: SpoolElement,
  index: number,
  findMaterial?: MaterialFinder,
): ElementCheck {
  const res = resolveElement(doc, el, index, findMaterial);
  if (!res.ok) return invalidResult(el, index, res.issues);
  const r = res.value;
  const ev = evaluate(contextFor(doc, r, true));
  const preBend = ev.preBend;
  return {
    id: el.id,
    kind: el.kind,
    index,
    status: ev.status,
    outsideDiameter: r.D,
    nominalWall: r.T,
    minimumWall: minimumWallOf(r, r.T),
    requiredNominalWall: ev.required,
    margin: ev.margin,
    governing: ev.governing,
    lightestSchedule: ev.lightest?.schedule ?? null,
    lightest: ev.lightest,
    mawp: ev.mawp,
    ...(preBend
      ? { preBendWall: Math.max(preBend.geometricWall, preBend.tableWall ?? 0), preBend }
      : {}),
    cases: ev.cases,
    messages: ev.messages ?? [],
    inputs: r.inputs,
    inputIssues: [],
  };
}

/** Message codes, each once, in order of first appearance. */
function uniqueCodes(codes: readonly string[]): string[] {
  const out: string[] = [];
  for (const c of codes) if (!out.includes(c)) out.push(c);
  return out;
}

function caseFigures(c: CaseResult): Omit<CaseResult, 'trail'> {
  const { trail: _trail, ...rest } = c;
  return rest;
}

/** The figures of a full result (what the numbers-only path computes directly). */
export function figuresOf(check: ElementCheck): ElementFigures {
  const { preBend } = check;
  let preBendFigures: Omit<PreBendResult, 'trail'> | undefined;
  if (preBend) {
    const { trail: _trail, ...rest } = preBend;
    preBendFigures = rest;
  }
  return {
    id: check.id,
    kind: check.kind,
    index: check.index,
    status: check.status,
    outsideDiameter: check.outsideDiameter,
    nominalWall: check.nominalWall,
    minimumWall: check.minimumWall,
    requiredNominalWall: check.requiredNominalWall,
    margin: check.margin,
    governing: check.governing,
    lightestSchedule: check.lightestSchedule,
    lightest: check.lightest,
    mawp: check.mawp,
    ...(preBendFigures ? { preBendWall: check.preBendWall ?? 0, preBend: preBendFigures } : {}),
    cases: check.cases.map(caseFigures),
    codes: uniqueCodes(check.messages.map((m) => m.code)),
  };
}

/**
 * Numbers-only check of one element: the same numbers as `checkElement`, without the trail,
 * the inputs list or any message text (codes only). `cache` shares the condition-derived inputs
 * between the elements of one document; make one per document.
 */
export function checkElementFigures(
  doc: SpoolDocument,
  el: SpoolElement,
  index: number,
  findMaterial: MaterialFinder | undefined,
  cache: ResolveCache,
): ElementFigures {
  const res = resolveElement(doc, el, index, findMaterial, cache);
  // Uncheckable inputs are rare: the full path names every issue.
  if (!res.ok) return figuresOf(checkElement(doc, el, index, findMaterial));
  const r = res.value;
  const ev = evaluate(contextFor(doc, r, false));
  const preBend: PreBendFigures | undefined = ev.preBend;
  const minimumWall = minimumWallOf(r, r.T);
  const lightestSchedule = ev.lightest !== null ? ev.lightest.schedule : null;
  const codes = codesOf(ev.mask);
  // Two literal shapes (with and without the bend's figures) rather than a spread: no extra objects.
  if (preBend) {
    return {
      id: el.id,
      kind: el.kind,
      index,
      status: ev.status,
      outsideDiameter: r.D,
      nominalWall: r.T,
      minimumWall,
      requiredNominalWall: ev.required,
      margin: ev.margin,
      governing: ev.governing,
      lightestSchedule,
      lightest: ev.lightest,
      mawp: ev.mawp,
      preBendWall: Math.max(preBend.geometricWall, preBend.tableWall ?? 0),
      preBend,
      cases: ev.cases,
      codes,
    };
  }
  return {
    id: el.id,
    kind: el.kind,
    index,
    status: ev.status,
    outsideDiameter: r.D,
    nominalWall: r.T,
    minimumWall,
    requiredNominalWall: ev.required,
    margin: ev.margin,
    governing: ev.governing,
    lightestSchedule,
    lightest: ev.lightest,
    mawp: ev.mawp,
    cases: ev.cases,
    codes,
  };
}
