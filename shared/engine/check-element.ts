import type { FieldIssue, SpoolDocument, SpoolElement } from '../model/spool';
import type { CaseName, CaseResult, CheckMessage, CheckStatus, ElementCheck, PreBendResult, TrailStep } from './types';
import { geometricThinning, preBendFactor } from '../data/code-tables';
import { listPipeWalls } from '../data/pipe-dimensions';
import { UNIT_LABELS } from '../units/units';
import { bendThickness, extradosFactor, intradosFactor, pressureForThickness, straightThickness, straightThicknessFromId, thickWallY } from './equations';
import { externalAllowable, minimumExternalWall } from './external';
import { fmt } from './format';
import type { MaterialFinder, ResolvedElement } from './resolve';
import { resolveElement } from './resolve';

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
  ext: 'B31.3 304.1.3 → VIII-1 UG-28 A; VIII-2 4.4.5.1 allowable',
} as const;

interface Ctx {
  readonly r: ResolvedElement;
  readonly lu: string;
  readonly pu: string;
}

/** Ordered nominal wall needed for a minimum wall tm: tm/(1 − tol), or tm + a fixed under-tolerance. */
function orderedWall(r: ResolvedElement, tm: number): number {
  return r.tolLength !== null ? tm + r.tolLength : tm / (1 - (r.tolFraction ?? 0));
}

/** Minimum wall of a nominal wall T after mill under-tolerance. */
function minimumWallOf(r: ResolvedElement, T: number): number {
  return r.tolLength !== null ? T - r.tolLength : T * (1 - (r.tolFraction ?? 0));
}

function tmAndOrdered(ctx: Ctx, t: number, trail: TrailStep[]): { tm: number; ordered: number } {
  const { r, lu } = ctx;
  const tm = t + r.c;
  trail.push({ equation: EQ.tm, label: 'minimum required thickness', formula: 'tm = t + c', substituted: `tm = ${fmt(t)} + ${fmt(r.c)}`, symbol: 'tm', value: tm, unit: lu });
  const ordered = orderedWall(r, tm);
  trail.push(
    r.tolLength !== null
      ? { equation: EQ.tol, label: 'ordered nominal wall needed', formula: 'T ≥ tm + under-tolerance', substituted: `T ≥ ${fmt(tm)} + ${fmt(r.tolLength)}`, symbol: 'T_req', value: ordered, unit: lu }
      : { equation: EQ.tol, label: 'ordered nominal wall needed', formula: 'T ≥ tm / (1 − tol)', substituted: `T ≥ ${fmt(tm)} / (1 − ${fmt(r.tolFraction ?? 0)})`, symbol: 'T_req', value: ordered, unit: lu },
  );
  return { tm, ordered };
}

interface InternalCase extends CaseResult {
  /** Y actually used (thick-wall corrected where t ≥ D/6). */
  readonly yUsed: number;
  readonly special: string[];
}

/** Internal pressure at one location: straight (I = 1, Eq. 3a or 3b) or a bend location (Eq. 3c with I). */
function internalCase(ctx: Ctx, name: CaseName, D: number, I: number | undefined): InternalCase {
  const { r, lu } = ctx;
  const trail: TrailStep[] = [];
  const special: string[] = [];
  const { P, S, E, W } = r;
  let Y = r.Y;
  const useId = name === 'straight' && r.d !== null;
  const compute = (y: number): number => {
    if (useId) return straightThicknessFromId(P, r.d ?? 0, r.c, S, E, W, y);
    return I === undefined ? straightThickness(P, D, S, E, W, y) : bendThickness(P, D, S, E, W, y, I);
  };
  if (I !== undefined) {
    trail.push({
      equation: name === 'intrados' ? EQ.d : name === 'extrados' ? EQ.e : 'B31.3 para. 304.2.1',
      label: `bend factor I at the ${name}`,
      formula: name === 'intrados' ? 'I = (4·(R1/D) − 1) / (4·(R1/D) − 2)' : name === 'extrados' ? 'I = (4·(R1/D) + 1) / (4·(R1/D) + 2)' : 'I = 1.0 at the sidewall (bend centreline)',
      substituted: name === 'sidewall' ? 'I = 1' : `I = (4 × ${fmt((r.bend?.R1 ?? 0) / D)} ${name === 'intrados' ? '− 1' : '+ 1'}) / (4 × ${fmt((r.bend?.R1 ?? 0) / D)} ${name === 'intrados' ? '− 2' : '+ 2'})`,
      symbol: 'I',
      value: I,
      unit: '',
    });
  }
  let t = compute(Y);
  const equation = useId ? EQ.b : I === undefined ? EQ.a : EQ.c;
  const pushT = (y: number, tv: number, note = '') => {
    if (useId) {
      trail.push({ equation: EQ.b, label: `pressure design thickness t${note}`, formula: 't = P·(d + 2c) / (2·[S·E·W − P·(1 − Y)])', substituted: `t = ${fmt(P)} × (${fmt(r.d ?? 0)} + 2 × ${fmt(r.c)}) / (2 × [${fmt(S)} × ${fmt(E)} × ${fmt(W)} − ${fmt(P)} × (1 − ${fmt(y)})])`, symbol: 't', value: tv, unit: lu });
    } else if (I === undefined) {
      trail.push({ equation: EQ.a, label: `pressure design thickness t${note}`, formula: 't = P·D / (2·(S·E·W + P·Y))', substituted: `t = ${fmt(P)} × ${fmt(D)} / (2 × (${fmt(S)} × ${fmt(E)} × ${fmt(W)} + ${fmt(P)} × ${fmt(y)}))`, symbol: 't', value: tv, unit: lu });
    } else {
      trail.push({ equation: EQ.c, label: `pressure design thickness t at the ${name}${note}`, formula: 't = P·D / (2·[(S·E·W / I) + P·Y])', substituted: `t = ${fmt(P)} × ${fmt(D)} / (2 × [(${fmt(S)} × ${fmt(E)} × ${fmt(W)} / ${fmt(I)}) + ${fmt(P)} × ${fmt(y)}])`, symbol: 't', value: tv, unit: lu });
    }
  };
  pushT(Y, t);
  if (t >= D / 6) {
    special.push(`t = ${fmt(t)} ${lu} ≥ D/6 = ${fmt(D / 6)} ${lu}: para. 304.1.2(b) requires special consideration (failure theory, fatigue, thermal stress)`);
    if (!r.yOverridden) {
      const d = D - 2 * r.T;
      Y = thickWallY(D, d, r.c);
      trail.push({ equation: 'B31.3 Table 304.1.1 note', label: 'coefficient Y for t ≥ D/6', formula: 'Y = (d + 2c) / (D + d + 2c)', substituted: `Y = (${fmt(d)} + 2 × ${fmt(r.c)}) / (${fmt(D)} + ${fmt(d)} + 2 × ${fmt(r.c)})`, symbol: 'Y', value: Y, unit: '' });
      t = compute(Y);
      pushT(Y, t, ' (thick-wall Y)');
    }
  }
  const pse = P / (S * E);
  if (pse > PSE_LIMIT) special.push(`P/(S·E) = ${fmt(pse)} > ${PSE_LIMIT}: para. 304.1.2(b) requires special consideration`);
  if (!Number.isFinite(t)) {
    special.push('the equation has no finite solution at this pressure');
  }
  const { tm, ordered } = tmAndOrdered(ctx, t, trail);
  return { case: name, ...(I !== undefined ? { I } : {}), t, tm, requiredNominalWall: ordered, equation, trail, yUsed: Y, special };
}

/** External pressure: minimum effective wall holding Pext, and the allowable of the chosen wall. */
function externalCase(ctx: Ctx, D: number, T: number): CaseResult | null {
  const { r, lu, pu } = ctx;
  const ext = r.external;
  if (!ext || r.Pext <= 0) return null;
  const trail: TrailStep[] = [];
  const t = minimumExternalWall(D, r.Pext, ext.L, ext.Ey, ext.Sy, r.S);
  const atMin = externalAllowable(D, t, ext.L, ext.Ey, ext.Sy, r.S);
  trail.push({ equation: 'VIII-1 UG-28', label: 'geometric factor A at the minimum wall', formula: 'A = max(1.1/(Do/t)², 1.30·(t/Do)^1.5 / (L/Do − 0.45·(t/Do)^0.5)), L/Do ≤ 50', substituted: `Do/t = ${fmt(D / t)}, L/Do = ${fmt(Math.min(ext.L / D, 50))}`, symbol: 'A', value: atMin.A, unit: '' });
  trail.push({ equation: 'VIII-2 4.4.5.1', label: 'minimum effective wall for external pressure', formula: 'smallest t with Pa(t) = 2·Fha·(t/Do) ≥ P_ext', substituted: `Pa(${fmt(t)}) = ${fmt(atMin.Pa)} ${pu} ≥ ${fmt(r.Pext)} ${pu}`, symbol: 't', value: t, unit: lu });
  const { tm, ordered } = tmAndOrdered(ctx, t, trail);
  const tEff = minimumWallOf(r, T) - r.c;
  let allowablePressure = 0;
  if (tEff > 0) {
    const a = externalAllowable(D, tEff, ext.L, ext.Ey, ext.Sy, r.S);
    allowablePressure = a.Pa;
    trail.push({ equation: 'VIII-2 4.4.5.1', label: 'chosen wall: effective thickness', formula: 't_e = T·(1 − tol) − c', substituted: `t_e = ${fmt(minimumWallOf(r, T))} − ${fmt(r.c)}`, symbol: 't_e', value: tEff, unit: lu });
    trail.push({ equation: 'VIII-1 UG-28', label: 'chosen wall: geometric factor A', formula: 'A (as above)', substituted: `Do/t = ${fmt(D / tEff)}`, symbol: 'A', value: a.A, unit: '' });
    trail.push({ equation: 'VIII-2 4.4.5.1', label: 'elastic hoop buckling stress', formula: 'Mx = L/√(Ro·t); Ch per Mx; Fhe = 1.6·Ch·Ey·t/Do', substituted: `Mx = ${fmt(a.Mx)}, Ch = ${fmt(a.Ch)}, Fhe = 1.6 × ${fmt(a.Ch)} × ${fmt(ext.Ey)} × ${fmt(tEff)} / ${fmt(D)}`, symbol: 'Fhe', value: a.Fhe, unit: pu });
    trail.push({ equation: 'VIII-2 4.4.5.1', label: 'predicted buckling stress and design factor', formula: 'Fic from Fhe/Sy; FS = 2.0 … 1.667; Fha = Fic/FS', substituted: `Fic = ${fmt(a.Fic)}, FS = ${fmt(a.FS)}, Fha = ${fmt(a.Fha)}`, symbol: 'Fha', value: a.Fha, unit: pu });
    trail.push({ equation: 'VIII-2 4.4.5.1', label: 'allowable external pressure of the chosen wall', formula: a.PaThick !== null ? 'Pa = min(2·Fha·(t/Do), UG-28(c) 2S/(Do/t)·(1 − 1/(Do/t)))' : 'Pa = 2·Fha·(t/Do)', substituted: `Pa = 2 × ${fmt(a.Fha)} × ${fmt(tEff)} / ${fmt(D)}`, symbol: 'Pa', value: a.Pa, unit: pu });
    trail.push({ equation: 'VIII-1 UG-28 (elastic)', label: 'cross-check: UG-28 elastic value (only where A lies left of the material line)', formula: 'Pa = 2·A·E / (3·(Do/t))', substituted: `Pa = 2 × ${fmt(a.A)} × ${fmt(ext.Ey)} / (3 × ${fmt(D / tEff)})`, symbol: 'Pa_el', value: a.PaElastic, unit: pu });
  }
  return { case: 'external', t, tm, requiredNominalWall: ordered, allowablePressure, equation: EQ.ext, trail };
}

/** Required ordered nominal wall over all cases, for a given D (used for the schedule search). */
function requirementFor(ctx: Ctx, D: number, T: number): { cases: CaseResult[]; special: string[]; internal: InternalCase[] } {
  const { r } = ctx;
  const internal: InternalCase[] = [];
  if (r.bend) {
    const ratio = r.bend.R1 / D;
    internal.push(internalCase(ctx, 'intrados', D, intradosFactor(ratio)));
    internal.push(internalCase(ctx, 'extrados', D, extradosFactor(ratio)));
    internal.push(internalCase(ctx, 'sidewall', D, 1));
  } else {
    internal.push(internalCase(ctx, 'straight', D, undefined));
  }
  const cases: CaseResult[] = internal.map(({ yUsed: _y, special: _s, ...c }) => c);
  const ext = externalCase(ctx, D, T);
  if (ext) cases.push(ext);
  const special = [...new Set(internal.flatMap((c) => c.special))];
  return { cases, special, internal };
}

function governingOf(cases: readonly CaseResult[]): CaseResult | undefined {
  let best: CaseResult | undefined;
  for (const c of cases) if (!best || c.requiredNominalWall > best.requiredNominalWall + 1e-12) best = c;
  return best;
}

function preBendFor(ctx: Ctx, internal: InternalCase[], T: number): PreBendResult | undefined {
  const { r, lu } = ctx;
  if (!r.bend) return undefined;
  const trail: TrailStep[] = [];
  const side = internal.find((c) => c.case === 'sidewall');
  const ext = internal.find((c) => c.case === 'extrados');
  const intr = internal.find((c) => c.case === 'intrados');
  if (!side || !ext || !intr) return undefined;
  // B31.1 Table 102.4.5 is indexed by R / nominal pipe size.
  const radiusRatio = r.bend.R1 / r.bend.nominalSize;
  const tf = preBendFactor(radiusRatio);
  const tableWall = tf.value !== null ? tf.value * side.tm : null;
  if (tf.value !== null && tableWall !== null) {
    trail.push({ equation: 'B31.1 Table 102.4.5', label: 'minimum wall before bending (table)', formula: 't_before = factor(R/NPS) × tm', substituted: `t_before = ${fmt(tf.value)} × ${fmt(side.tm)}  (R/NPS = ${fmt(radiusRatio)})`, symbol: 't_tab', value: tableWall, unit: lu });
  }
  const g = geometricThinning(r.bend.R1 / r.D);
  const tmin = minimumWallOf(r, T);
  const expectedExtradosWall = tmin * g.extrados;
  const expectedIntradosWall = tmin * g.intrados;
  const geometricWall = Math.max(ext.tm / g.extrados, intr.tm / g.intrados);
  trail.push({ equation: 'geometric estimate (common practice)', label: 'extrados thinning factor', formula: 'f_ext = (2R/D) / (2R/D + 1)', substituted: `f_ext = ${fmt((2 * r.bend.R1) / r.D)} / (${fmt((2 * r.bend.R1) / r.D)} + 1)`, symbol: 'f_ext', value: g.extrados, unit: '' });
  trail.push({ equation: 'geometric estimate (common practice)', label: 'minimum wall before bending (geometric)', formula: 't_before = max(tm_ext / f_ext, tm_int / f_int)', substituted: `t_before = max(${fmt(ext.tm)} / ${fmt(g.extrados)}, ${fmt(intr.tm)} / ${fmt(g.intrados)})`, symbol: 't_geo', value: geometricWall, unit: lu });
  const before = Math.max(geometricWall, tableWall ?? 0);
  const requiredOrderedWall = orderedWall(r, before);
  trail.push({ equation: EQ.tol, label: 'ordered nominal wall for the bend pipe', formula: r.tolLength !== null ? 'T ≥ t_before + under-tolerance' : 'T ≥ t_before / (1 − tol)', substituted: r.tolLength !== null ? `T ≥ ${fmt(before)} + ${fmt(r.tolLength)}` : `T ≥ ${fmt(before)} / (1 − ${fmt(r.tolFraction ?? 0)})`, symbol: 'T_bend', value: requiredOrderedWall, unit: lu });
  const orderHeavier = T < requiredOrderedWall - 1e-12;
  let orderSchedule: string | null = null;
  if (r.nps !== null) {
    const units = ctx.lu === 'mm';
    for (const w of listPipeWalls(r.nps)) {
      const wall = units ? w.wallMm : w.wallIn;
      if (wall >= requiredOrderedWall - 1e-12 && preferSameFamily(r.schedule, w.schedule)) {
        orderSchedule = w.schedule;
        break;
      }
    }
  }
  return {
    radiusRatio,
    tableFactor: tf.value,
    tableWall,
    extradosThinning: 1 - g.extrados,
    intradosThickening: g.intrados - 1,
    expectedExtradosWall,
    expectedIntradosWall,
    geometricWall,
    requiredOrderedWall,
    orderHeavier,
    orderSchedule,
    trail,
  };
}

/** Stainless "S" schedules are offered for S-schedule pipe, the B36.10M ones otherwise. */
function preferSameFamily(current: string | null, candidate: string): boolean {
  if (current === null) return true;
  return current.endsWith('S') === candidate.endsWith('S');
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
    mawp: 0,
    cases: [],
    messages: issues.map((i) => ({ level: 'error' as const, code: 'input', text: `${i.path}: ${i.message}` })),
    inputs: [],
    inputIssues: issues,
  };
}

/**
 * Check one element: every pressure case, the governing ordered wall, MAWP, status, the lightest
 * passing schedule and (bends) the wall needed before bending. Never throws for rule violations.
 */
export function checkElement(doc: SpoolDocument, el: SpoolElement, index: number, findMaterial?: MaterialFinder): ElementCheck {
  const res = resolveElement(doc, el, index, findMaterial);
  if (!res.ok) return invalidResult(el, index, res.issues);
  const r = res.value;
  const u = UNIT_LABELS[doc.units];
  const ctx: Ctx = { r, lu: u.length, pu: u.pressure };
  const { cases, special, internal } = requirementFor(ctx, r.D, r.T);
  const gov = governingOf(cases);
  const required = gov?.requiredNominalWall ?? 0;
  const messages: CheckMessage[] = r.notes.map((n) => ({ ...n }));

  // MAWP of the chosen wall: the lowest internal pressure any location holds.
  const tAvail = minimumWallOf(r, r.T) - r.c;
  let mawp = Number.POSITIVE_INFINITY;
  for (const c of internal) mawp = Math.min(mawp, pressureForThickness(tAvail, r.D, r.S, r.E, r.W, c.yUsed, c.I ?? 1));
  if (!Number.isFinite(mawp)) mawp = 0;

  const margin = required > 0 ? (r.T - required) / required : null;
  const passes = r.T >= required - 1e-12 && Number.isFinite(required);
  let status: CheckStatus;
  if (special.length > 0) status = 'review';
  else if (!passes) status = 'fail';
  else if (margin !== null && margin < MARGINAL_LIMIT) status = 'marginal';
  else status = 'pass';
  for (const s of special) messages.push({ level: 'warning', code: 'special-consideration', text: s });
  if (status === 'review' && !passes) messages.push({ level: 'error', code: 'wall-short', text: `the chosen wall ${fmt(r.T)} ${u.length} is also below the ${fmt(required)} ${u.length} needed` });
  if (status === 'fail') messages.push({ level: 'error', code: 'wall-short', text: `nominal wall ${fmt(r.T)} ${u.length} < ${fmt(required)} ${u.length} needed (${gov?.case ?? ''} governs)` });
  if (status === 'marginal') messages.push({ level: 'warning', code: 'marginal', text: `margin on the ordered wall is ${fmt((margin ?? 0) * 100)} % (< ${MARGINAL_LIMIT * 100} %)` });
  const ext = cases.find((c) => c.case === 'external');
  if (ext?.allowablePressure !== undefined) {
    messages.push({ level: 'info', code: 'external-allowable', text: `allowable external pressure of the chosen wall: ${fmt(ext.allowablePressure)} ${u.pressure} (VIII-2 4.4.5.1 closed form, from memory — verify)` });
  }

  // Lightest passing schedule for this NPS (same OD family; recomputed where the OD differs).
  let lightestSchedule: string | null = null;
  if (r.nps !== null && special.length === 0) {
    for (const w of listPipeWalls(r.nps)) {
      if (!preferSameFamily(r.schedule, w.schedule)) continue;
      const D = doc.units === 'metric' ? w.odMm : w.odIn;
      const T = doc.units === 'metric' ? w.wallMm : w.wallIn;
      const req = Math.abs(D - r.D) < 1e-9 ? required : (governingOf(requirementFor(ctx, D, T).cases)?.requiredNominalWall ?? 0);
      if (T >= req - 1e-12) {
        lightestSchedule = w.schedule;
        break;
      }
    }
    if (lightestSchedule === null) messages.push({ level: 'error', code: 'no-schedule', text: `no listed schedule of NPS ${r.nps} gives the wall needed` });
  }

  const preBend = preBendFor(ctx, internal, r.T);
  if (preBend?.orderHeavier) {
    messages.push({ level: 'warning', code: 'order-heavier', text: `order the bend pipe heavier: ${fmt(preBend.requiredOrderedWall)} ${u.length} nominal needed before bending${preBend.orderSchedule ? ` (schedule ${preBend.orderSchedule})` : ''}` });
  }
  if (preBend && preBend.tableFactor === null) {
    messages.push({ level: 'info', code: 'pre-bend-table', text: `R/NPS = ${fmt(preBend.radiusRatio)} is below the 3D start of B31.1 Table 102.4.5: geometric estimate only` });
  }
  if (r.bend) {
    messages.push({ level: 'info', code: 'flattening', text: 'flattening (max OD − min OD) must not exceed 8 % of nominal OD for internal pressure, 3 % for external (para. 332.2.1, from memory): verify at fabrication' });
  }
  const memory = r.inputs.filter((i) => i.fromMemory);
  if (memory.length > 0) {
    messages.push({ level: 'warning', code: 'from-memory', text: `uses values recalled from memory (${memory.map((m) => m.symbol).join(', ')}): verify against the licensed edition` });
  }

  return {
    id: el.id,
    kind: el.kind,
    index,
    status,
    outsideDiameter: r.D,
    nominalWall: r.T,
    minimumWall: minimumWallOf(r, r.T),
    requiredNominalWall: required,
    margin,
    governing: gov?.case ?? null,
    lightestSchedule,
    mawp,
    ...(preBend ? { preBendWall: Math.max(preBend.geometricWall, preBend.tableWall ?? 0), preBend } : {}),
    cases,
    messages,
    inputs: r.inputs,
    inputIssues: [],
  };
}
