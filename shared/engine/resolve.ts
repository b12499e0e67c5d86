import type { Conditions, FieldIssue, ProductForm, SpoolDocument, SpoolElement } from '../model/spool';
import type { SourcedValue } from './types';
import type { Material } from '../data/materials';
import { allowableStressAt, elasticModulusAt, findMaterial as findLibraryMaterial, MODULUS_SOURCE, MODULUS_TABLE, yieldStrengthAt } from '../data/materials';
import { coefficientY, GROOVE_TOLERANCE_IN, MILL_TOLERANCE_DEFAULT, qualityFactorE, threadDepth, weldStrengthFactorW } from '../data/code-tables';
import { getPipeSize, getPipeWall, normalizeNps, normalizeSchedule, npsToNumber } from '../data/pipe-dimensions';
import { lengthFromInches, pressureFromPsi, temperatureToF, UNIT_LABELS } from '../units/units';
import { fmt } from './format';

/** Every input of one element's check, resolved to numbers in the document's units, with sources. */
export interface ResolvedElement {
  readonly element: SpoolElement;
  readonly index: number;
  /** Canonical NPS, or null for explicit diameters. */
  readonly nps: string | null;
  readonly schedule: string | null;
  readonly D: number;
  /** Nominal wall T of the chosen pipe. */
  readonly T: number;
  readonly P: number;
  readonly Pext: number;
  readonly tempF: number;
  readonly S: number;
  readonly E: number;
  readonly W: number;
  /** Y from Table 304.1.1 (before any thick-wall correction). */
  readonly Y: number;
  readonly yOverridden: boolean;
  /** c: corrosion allowance + thread or groove depth. */
  readonly c: number;
  /** Mill under-tolerance: a fraction, or a fixed length (then fraction is null). */
  readonly tolFraction: number | null;
  readonly tolLength: number | null;
  /** External pressure inputs, present when Pext > 0. */
  readonly external: { readonly L: number; readonly longCylinder: boolean; readonly Ey: number; readonly Sy: number } | null;
  /** Explicit inside diameter for Eq. (3b). */
  readonly d: number | null;
  /** Bends: centreline radius R1 (length units) and the nominal size used for R1 multiples and the pre-bend table. */
  readonly bend: { readonly R1: number; readonly nominalSize: number; readonly angle: number } | null;
  readonly material: Material | null;
  readonly inputs: SourcedValue[];
  readonly notes: { level: 'info' | 'warning'; code: string; text: string }[];
}

export type MaterialFinder = (idOrSpec: string) => Material | undefined;

export type ResolveResult = { ok: true; value: ResolvedElement } | { ok: false; issues: FieldIssue[] };

/** Which path a condition's value came from: the element override or the spool default. */
function conditionPath(el: SpoolElement, index: number, key: keyof Conditions): string {
  return el.conditions && el.conditions[key] !== undefined ? `elements[${index}].conditions.${key}` : `conditions.${key}`;
}

function conditionSource(el: SpoolElement, key: keyof Conditions): string {
  return el.conditions && el.conditions[key] !== undefined ? 'element override' : 'spool conditions';
}

/**
 * Resolve an element's inputs: pipe size from ASME B36.10M/B36.19M, S/E/W/Y from the B31.3 tables,
 * allowances and tolerances. Problems that make the element uncheckable come back as field issues.
 */
export function resolveElement(doc: SpoolDocument, el: SpoolElement, index: number, findMaterial: MaterialFinder = findLibraryMaterial): ResolveResult {
  const units = doc.units;
  const u = UNIT_LABELS[units];
  const issues: FieldIssue[] = [];
  const inputs: SourcedValue[] = [];
  const notes: ResolvedElement['notes'] = [];
  const cond: Conditions = { ...doc.conditions, ...stripUndefined(el.conditions ?? {}) };
  const at = (field: string) => `elements[${index}].${field}`;

  // --- pipe size
  let nps: string | null = null;
  let schedule: string | null = null;
  let D: number | undefined;
  let T: number | undefined;
  let dimSource = '';
  if (el.nps !== undefined) {
    const n = normalizeNps(el.nps);
    if (n === undefined) issues.push({ path: at('nps'), message: `NPS ${String(el.nps)} is not a size listed in ASME B36.10M/B36.19M` });
    else nps = n;
  }
  if (el.schedule !== undefined && el.nominalWall === undefined) {
    const s = normalizeSchedule(el.schedule);
    if (s === undefined) issues.push({ path: at('schedule'), message: `schedule "${el.schedule}" is not known (use 10, 20, 30, 40, 60, 80, 100, 120, 140, 160, STD, XS, XXS, 5S, 10S, 40S, 80S)` });
    else schedule = s;
  }
  if (nps !== null && schedule !== null) {
    const wall = getPipeWall(nps, schedule);
    if (!wall) {
      issues.push({ path: at('schedule'), message: `NPS ${nps} has no schedule ${schedule} in ASME ${schedule.endsWith('S') ? 'B36.19M' : 'B36.10M'}` });
    } else {
      D = units === 'metric' ? wall.odMm : wall.odIn;
      T = units === 'metric' ? wall.wallMm : wall.wallIn;
      dimSource = wall.source;
    }
  } else if (nps !== null && el.schedule === undefined && el.nominalWall !== undefined) {
    const size = getPipeSize(nps);
    if (size) {
      D = units === 'metric' ? size.odMm : size.odIn;
      dimSource = 'ASME B36.10M (outside diameter)';
    }
  } else if (nps === null && el.schedule !== undefined && el.nominalWall === undefined && el.nps === undefined) {
    issues.push({ path: at('schedule'), message: 'a schedule needs nps; give nominalWall with outsideDiameter' });
  }
  let d: number | null = null;
  if (el.outsideDiameter !== undefined) {
    D = el.outsideDiameter;
    dimSource = 'element outsideDiameter';
  }
  if (el.nominalWall !== undefined) T = el.nominalWall;
  if (el.insideDiameter !== undefined) {
    if (T === undefined) issues.push({ path: at('nominalWall'), message: 'insideDiameter needs a nominal wall (schedule or nominalWall)' });
    else {
      d = el.insideDiameter;
      if (el.outsideDiameter === undefined && el.nps === undefined) {
        D = d + 2 * T;
        dimSource = 'insideDiameter + 2·nominalWall';
      } else if (D !== undefined && Math.abs(D - 2 * T - d) > 1e-6 * D) {
        issues.push({ path: at('insideDiameter'), message: `insideDiameter ${fmt(d)} ${u.length} does not equal D − 2T = ${fmt(D - 2 * T)} ${u.length}` });
      }
    }
  }
  if (D !== undefined && T !== undefined && T >= D / 2) {
    issues.push({ path: at(el.nominalWall !== undefined ? 'nominalWall' : 'schedule'), message: `nominal wall ${fmt(T)} ${u.length} is not less than half the outside diameter ${fmt(D)} ${u.length}` });
  }
  if (D !== undefined) inputs.push({ symbol: 'D', label: 'outside diameter', value: D, unit: u.length, source: dimSource });
  if (T !== undefined) inputs.push({ symbol: 'T', label: 'nominal wall', value: T, unit: u.length, source: el.nominalWall !== undefined ? 'element nominalWall' : dimSource });
  if (d !== null) inputs.push({ symbol: 'd', label: 'inside diameter', value: d, unit: u.length, source: 'element insideDiameter' });

  // --- temperature, pressures
  const tempF = temperatureToF(cond.temperature, units);
  inputs.push({ symbol: 'T_d', label: 'design temperature', value: cond.temperature, unit: u.temperature, source: conditionSource(el, 'temperature') });
  const P = cond.pressure;
  inputs.push({ symbol: 'P', label: 'internal design gauge pressure', value: P, unit: u.pressure, source: conditionSource(el, 'pressure') });
  const Pext = cond.externalPressure ?? 0;
  if (Pext > 0) inputs.push({ symbol: 'P_ext', label: 'external design pressure', value: Pext, unit: u.pressure, source: conditionSource(el, 'externalPressure') });

  // --- material and S
  let material: Material | null = null;
  if (cond.material !== undefined) {
    const m = findMaterial(cond.material);
    if (!m) issues.push({ path: conditionPath(el, index, 'material'), message: `material "${cond.material}" is not in the materials library` });
    else material = m;
  }
  let S: number | undefined;
  if (cond.allowableStress !== undefined) {
    S = cond.allowableStress;
    inputs.push({ symbol: 'S', label: 'allowable stress', value: S, unit: u.pressure, source: conditionSource(el, 'allowableStress') });
  } else if (material) {
    const r = allowableStressAt(material, tempF);
    if (!r.ok) issues.push({ path: conditionPath(el, index, 'temperature'), message: `${material.id}: ${r.reason}` });
    else {
      S = pressureFromPsi(r.value, units);
      inputs.push({ symbol: 'S', label: `allowable stress, ${material.id} at ${fmt(cond.temperature)} ${u.temperature}`, value: S, unit: u.pressure, source: r.source, fromMemory: r.fromMemory });
    }
  }
  // Lower temperature bound: a material's listed minimum is checked by allowableStressAt; one
  // without a listed minimum is bounded by the lowest temperature its tables cover (the B31.3
  // Table C-6 modulus row, which starts at −325 °F), so nothing colder passes unnoticed.
  if (material && material.minTempF === undefined && !issues.some((i) => i.path.endsWith('temperature'))) {
    const lowest = MODULUS_TABLE[material.modulusGroup]?.[0]?.tempF;
    if (lowest !== undefined && tempF < lowest) {
      issues.push({
        path: conditionPath(el, index, 'temperature'),
        message: `${material.id}: ${fmt(cond.temperature)} ${u.temperature} is below the lowest temperature its tables cover (${fmt(lowest)} °F, ${MODULUS_SOURCE}) and no minimum temperature is held for it; see B31.3 para. 323.2.2`,
      });
    }
  }
  if (material?.minTempF !== undefined && tempF < material.minTempF) {
    notes.push({ level: 'warning', code: 'below-min-temperature', text: `design temperature is below ${material.id}'s minimum temperature without impact testing (${fmt(material.minTempF)} °F); B31.3 Chapter III impact-test rules apply` });
  }

  // --- E, W, Y
  const form: ProductForm = cond.productForm ?? 'seamless';
  let E: number;
  if (cond.qualityFactor !== undefined) {
    E = cond.qualityFactor;
    inputs.push({ symbol: 'E', label: 'quality factor', value: E, unit: '', source: conditionSource(el, 'qualityFactor') });
  } else {
    const q = qualityFactorE(form);
    E = q.value;
    inputs.push({ symbol: 'E', label: `quality factor, ${form}`, value: E, unit: '', source: q.source });
    if (material && !material.productForms.includes(form)) {
      notes.push({ level: 'warning', code: 'product-form', text: `${material.id} is not made as ${form} pipe in its specification; check the product form` });
    }
  }
  let W: number;
  if (cond.weldStrengthFactor !== undefined) {
    W = cond.weldStrengthFactor;
    inputs.push({ symbol: 'W', label: 'weld joint strength reduction factor', value: W, unit: '', source: conditionSource(el, 'weldStrengthFactor') });
  } else if (material) {
    const w = weldStrengthFactorW(material.wFamily, form, tempF);
    W = w.value;
    inputs.push({ symbol: 'W', label: `weld joint strength reduction factor (${w.rule})`, value: W, unit: '', source: w.source });
    if (W < 1 || w.rule.includes('not embedded')) {
      notes.push({ level: 'warning', code: 'w-rule', text: `W = ${fmt(W)}: ${w.rule}` });
    }
  } else {
    W = 1;
    inputs.push({ symbol: 'W', label: 'weld joint strength reduction factor', value: 1, unit: '', source: 'assumed 1.0: no material given (set weldStrengthFactor for welded pipe at elevated temperature)' });
    if (form !== 'seamless') notes.push({ level: 'warning', code: 'w-assumed', text: 'W assumed 1.0 without a material; give weldStrengthFactor' });
  }
  let Y: number;
  const yOverridden = cond.coefficientY !== undefined;
  if (cond.coefficientY !== undefined) {
    Y = cond.coefficientY;
    inputs.push({ symbol: 'Y', label: 'coefficient Y', value: Y, unit: '', source: conditionSource(el, 'coefficientY') });
  } else {
    const y = coefficientY(material?.yFamily ?? 'other', tempF);
    Y = y.value;
    inputs.push({ symbol: 'Y', label: `coefficient Y (${material?.yFamily ?? 'other ductile metals'})`, value: Y, unit: '', source: y.source });
  }

  // --- allowances and tolerance
  const ca = cond.corrosionAllowance ?? 0;
  let c = ca;
  inputs.push({ symbol: 'c_a', label: 'corrosion/erosion allowance', value: ca, unit: u.length, source: cond.corrosionAllowance !== undefined ? conditionSource(el, 'corrosionAllowance') : 'default 0' });
  if (el.kind === 'straight' && el.endType === 'threaded') {
    const npsValue = nps !== null ? npsToNumber(nps) : undefined;
    if (npsValue === undefined) issues.push({ path: at('endType'), message: 'threaded ends need nps to find the thread depth' });
    else {
      const th = threadDepth(npsValue);
      const h = lengthFromInches(th.inches, units);
      c += h;
      inputs.push({ symbol: 'h', label: `NPT thread depth (${th.threadsPerInch} threads/in)`, value: h, unit: u.length, source: th.source });
    }
  }
  if (el.kind === 'straight' && el.endType === 'grooved') {
    if (cond.grooveDepth === undefined) issues.push({ path: conditionPath(el, index, 'grooveDepth'), message: 'grooved ends need grooveDepth' });
    else {
      const g = cond.grooveDepth + lengthFromInches(GROOVE_TOLERANCE_IN, units);
      c += g;
      inputs.push({ symbol: 'g', label: 'groove depth + 0.02 in tolerance', value: g, unit: u.length, source: 'groove depth from conditions; +0.02 in (0.5 mm) where no tolerance is stated [from memory]', fromMemory: true });
    }
  }
  let tolFraction: number | null = null;
  let tolLength: number | null = null;
  if (cond.millToleranceLength !== undefined) {
    tolLength = cond.millToleranceLength;
    inputs.push({ symbol: 'tol', label: 'mill under-tolerance (fixed length)', value: tolLength, unit: u.length, source: conditionSource(el, 'millToleranceLength') });
  } else {
    tolFraction = cond.millTolerance ?? MILL_TOLERANCE_DEFAULT;
    inputs.push({ symbol: 'tol', label: 'mill under-tolerance (fraction of nominal)', value: tolFraction, unit: '', source: cond.millTolerance !== undefined ? conditionSource(el, 'millTolerance') : 'default 12.5 % (ASTM A530/A999 for A106, A53, A312)' });
  }

  // --- bend geometry
  let bend: ResolvedElement['bend'] = null;
  if (el.kind === 'bend' && D !== undefined) {
    // "3D bend" in shop practice means R1 = 3 × nominal size [common practice]; D itself where no NPS.
    const nominalSize = nps !== null ? lengthFromInches(npsToNumber(nps), units) : D;
    const R1 = typeof el.bendRadius === 'number' ? el.bendRadius : el.bendRadius.multipleOfD * nominalSize;
    inputs.push({
      symbol: 'R1',
      label: 'bend radius (centreline)',
      value: R1,
      unit: u.length,
      source: typeof el.bendRadius === 'number' ? 'element bendRadius' : `${fmt(el.bendRadius.multipleOfD)} × nominal size ${fmt(nominalSize)} ${u.length} (common practice: "nD" = n × NPS)`,
    });
    if (R1 / D <= 0.5) {
      issues.push({ path: at('bendRadius'), message: `R1/D = ${fmt(R1 / D)} must exceed 0.5 for Eq. (3d)` });
    } else if (R1 < 1.5 * D) {
      notes.push({ level: 'warning', code: 'tight-bend', text: `R1 = ${fmt(R1 / D)}·D is under 1.5·D: such tight bends are normally elbows, not pipe bends` });
    }
    bend = { R1, nominalSize, angle: el.angle };
  }

  // --- external pressure inputs
  let external: ResolvedElement['external'] = null;
  if (Pext > 0 && D !== undefined) {
    let Ey: number | undefined;
    let Sy: number | undefined;
    if (cond.elasticModulus !== undefined) {
      Ey = cond.elasticModulus;
      inputs.push({ symbol: 'E_y', label: 'elastic modulus', value: Ey, unit: u.pressure, source: conditionSource(el, 'elasticModulus') });
    } else if (material) {
      const r = elasticModulusAt(material.modulusGroup, tempF);
      if (!r.ok) issues.push({ path: conditionPath(el, index, 'elasticModulus'), message: `${material.id}: ${r.reason}` });
      else {
        Ey = pressureFromPsi(r.value, units);
        inputs.push({ symbol: 'E_y', label: 'elastic modulus at temperature', value: Ey, unit: u.pressure, source: r.source, fromMemory: r.fromMemory });
      }
    } else issues.push({ path: conditionPath(el, index, 'elasticModulus'), message: 'external pressure needs elasticModulus (or a material)' });
    if (cond.yieldStrength !== undefined) {
      Sy = cond.yieldStrength;
      inputs.push({ symbol: 'S_y', label: 'yield strength', value: Sy, unit: u.pressure, source: conditionSource(el, 'yieldStrength') });
    } else if (material) {
      const r = yieldStrengthAt(material, tempF);
      if (r.ok) {
        Sy = pressureFromPsi(r.value, units);
        inputs.push({ symbol: 'S_y', label: 'yield strength at temperature', value: Sy, unit: u.pressure, source: r.source, fromMemory: r.fromMemory });
      } else if (S !== undefined) {
        // Lower bound from the Table A-1 basis (para. 302.3.2): S ≤ 2/3·Sy(T), or ≤ 0.9·Sy(T) for austenitic steels.
        const k = material.yFamily === 'austenitic' ? 1 / 0.9 : 1.5;
        Sy = Math.min(pressureFromPsi(material.yieldPsi, units), k * S);
        inputs.push({ symbol: 'S_y', label: 'yield strength at temperature (lower bound)', value: Sy, unit: u.pressure, source: `min(specified minimum yield, ${material.yFamily === 'austenitic' ? 'S/0.9' : '1.5·S'}) from the Table A-1 stress basis (para. 302.3.2); give yieldStrength for the tabulated value` });
        notes.push({ level: 'info', code: 'yield-lower-bound', text: `${material.id} has no yield table: Sy taken as a lower bound from S` });
      }
    } else if (S !== undefined) {
      Sy = 1.5 * S;
      inputs.push({ symbol: 'S_y', label: 'yield strength (lower bound)', value: Sy, unit: u.pressure, source: '1.5·S from the Table A-1 stress basis (para. 302.3.2); give yieldStrength' });
    }
    let L: number;
    let longCylinder = false;
    if (cond.stiffenedLength !== undefined) {
      L = cond.stiffenedLength;
      inputs.push({ symbol: 'L', label: 'design length between stiffeners', value: L, unit: u.length, source: conditionSource(el, 'stiffenedLength') });
    } else {
      L = 50 * D;
      longCylinder = true;
      inputs.push({ symbol: 'L', label: 'design length between stiffeners', value: L, unit: u.length, source: 'not given: treated as a long cylinder (L/Do = 50, conservative)' });
      notes.push({ level: 'info', code: 'long-cylinder', text: 'no stiffenedLength: external pressure checked as a long cylinder' });
    }
    if (Ey !== undefined && Sy !== undefined) external = { L, longCylinder, Ey, Sy };
  }

  if (S === undefined && !issues.some((i) => i.path.endsWith('material') || i.path.endsWith('temperature'))) {
    issues.push({ path: conditionPath(el, index, 'material'), message: 'give material or allowableStress' });
  }
  if (D === undefined && issues.length === 0) issues.push({ path: at('nps'), message: 'outside diameter could not be found' });
  if (T === undefined && issues.length === 0) issues.push({ path: at('schedule'), message: 'nominal wall could not be found' });
  if (issues.length > 0 || D === undefined || T === undefined || S === undefined) return { ok: false, issues };

  return {
    ok: true,
    value: { element: el, index, nps, schedule, D, T, P, Pext, tempF, S, E, W, Y, yOverridden, c, tolFraction, tolLength, external, d, bend, material, inputs, notes },
  };
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  const out: Partial<T> = {};
  for (const [k, v] of Object.entries(o)) if (v !== undefined) (out as Record<string, unknown>)[k] = v;
  return out;
}
