import type {
  Conditions,
  FieldIssue,
  ProductForm,
  SpoolDocument,
  SpoolElement,
} from '../model/spool';
import type { SourcedValue } from './types';
import type { Material } from '../data/materials';
import {
  allowableStressAt,
  elasticModulusAt,
  findMaterial as findLibraryMaterial,
  MODULUS_SOURCE,
  MODULUS_TABLE,
  yieldStrengthAt,
} from '../data/materials';
import {
  coefficientY,
  GROOVE_TOLERANCE_IN,
  MILL_TOLERANCE_DEFAULT,
  qualityFactorE,
  threadDepth,
  weldStrengthFactorW,
} from '../data/code-tables';
import {
  getPipeSize,
  getPipeWall,
  isCanonicalNps,
  isCanonicalSchedule,
  normalizeNps,
  normalizeSchedule,
  npsToNumber,
  scheduleStandard,
  type PipeStandard,
} from '../data/pipe-dimensions';
import { lengthFromInches, pressureFromPsi, temperatureToF, UNIT_LABELS } from '../units/units';
import { fmt } from './format';

/** A note the resolver attaches to an element (becomes a message of its check). */
export interface ResolveNote {
  readonly level: 'info' | 'warning';
  readonly code: string;
  /** Empty on the numbers-only path (only the code is kept). */
  readonly text: string;
}

/** Every input of one element's check, resolved to numbers in the document's units, with sources. */
export interface ResolvedElement {
  readonly element: SpoolElement;
  readonly index: number;
  /** Canonical NPS, or null for explicit diameters. */
  readonly nps: string | null;
  readonly schedule: string | null;
  /** The element's own dimension standard (from its schedule; for a bare wall, from its material). */
  readonly standard: PipeStandard;
  /** True for stainless elements (B36.19M schedule or an austenitic material): B36.10M walls are the fallback. */
  readonly stainless: boolean;
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
  readonly external: {
    readonly L: number;
    readonly longCylinder: boolean;
    readonly Ey: number;
    readonly Sy: number;
  } | null;
  /** Explicit inside diameter for Eq. (3b). */
  readonly d: number | null;
  /**
   * Bends: centreline radius R1 (length units), the nominal size used for R1 multiples and the
   * pre-bend table, and the multiple itself where the radius was given as "nD" (so R1/NPS is exact).
   */
  readonly bend: {
    readonly R1: number;
    readonly nominalSize: number;
    readonly angle: number;
    readonly multiple: number | null;
  } | null;
  readonly material: Material | null;
  /** Empty on the numbers-only path. */
  readonly inputs: SourcedValue[];
  readonly notes: ResolveNote[];
  /** Symbols of inputs recalled from memory (the "from-memory" message). */
  readonly memorySymbols: string[];
  /**
   * Numbers-only path: minimum external walls already solved in this run for these conditions,
   * keyed by diameter and length (the solve is a pure function of them). Null on the full path.
   */
  readonly externalWalls: Map<number, [number, number, number]> | null;
}

export type MaterialFinder = (idOrSpec: string) => Material | undefined;

export type ResolveResult =
  | { ok: true; value: ResolvedElement }
  | { ok: false; issues: FieldIssue[] };

/**
 * Per-run cache of the condition-derived inputs for the numbers-only path, keyed by the
 * conditions object an element uses (the spool's, or its own overrides). Create one per document.
 */
export type ResolveCache = Map<object, ConditionPart>;

const NO_INPUTS: SourcedValue[] = [];

function elementPath(index: number, field: string): string {
  return `elements[${index}].${field}`;
}

/** Which path a condition's value came from: the element override or the spool default. */
function conditionPath(el: SpoolElement, index: number, key: keyof Conditions): string {
  return el.conditions && el.conditions[key] !== undefined
    ? `elements[${index}].conditions.${key}`
    : `conditions.${key}`;
}

function conditionSource(el: SpoolElement, key: keyof Conditions): string {
  return el.conditions && el.conditions[key] !== undefined
    ? 'element override'
    : 'spool conditions';
}

/** Inputs that depend only on the conditions an element uses (not on its size or kind). */
interface ConditionPart {
  readonly cond: Conditions;
  readonly issues: FieldIssue[];
  /** Issues of the external-pressure inputs (reported only where the element has a diameter). */
  readonly extIssues: FieldIssue[];
  readonly tempF: number;
  readonly P: number;
  readonly Pext: number;
  readonly material: Material | null;
  readonly S: number | undefined;
  readonly E: number;
  readonly W: number;
  readonly Y: number;
  readonly yOverridden: boolean;
  readonly ca: number;
  readonly tolFraction: number | null;
  readonly tolLength: number | null;
  readonly Ey: number | undefined;
  readonly Sy: number | undefined;
  readonly L: number | undefined;
  readonly notes: ResolveNote[];
  readonly extNotes: ResolveNote[];
  readonly memorySymbols: string[];
  readonly extMemorySymbols: string[];
  /** T_d … c_a, in trail order (full path only). */
  readonly inputs: SourcedValue[];
  readonly tolInput: SourcedValue | null;
  readonly extInputs: SourcedValue[];
  readonly externalWalls: Map<number, [number, number, number]> | null;
}

/** The spool's explicit allowable stress applied to an element whose material differs from the spool's. */
export const SPOOL_STRESS_CODE = 'material-vs-spool-stress';

function resolveConditions(
  doc: SpoolDocument,
  el: SpoolElement,
  index: number,
  findMaterial: MaterialFinder,
  full: boolean,
): ConditionPart {
  const units = doc.units;
  const u = UNIT_LABELS[units];
  const issues: FieldIssue[] = [];
  const extIssues: FieldIssue[] = [];
  const inputs: SourcedValue[] = [];
  const extInputs: SourcedValue[] = [];
  const notes: ResolveNote[] = [];
  const extNotes: ResolveNote[] = [];
  const memorySymbols: string[] = [];
  const extMemorySymbols: string[] = [];
  const cond: Conditions = el.conditions
    ? { ...doc.conditions, ...stripUndefined(el.conditions) }
    : doc.conditions;
  const add = (v: SourcedValue) => {
    if (full) inputs.push(v);
  };

  // --- temperature, pressures
  const tempF = temperatureToF(cond.temperature, units);
  if (full)
    add({
      symbol: 'T_d',
      label: 'design temperature',
      value: cond.temperature,
      unit: u.temperature,
      source: conditionSource(el, 'temperature'),
    });
  const P = cond.pressure;
  if (full)
    add({
      symbol: 'P',
      label: 'internal design gauge pressure',
      value: P,
      unit: u.pressure,
      source: conditionSource(el, 'pressure'),
    });
  const Pext = cond.externalPressure ?? 0;
  if (full && Pext > 0)
    add({
      symbol: 'P_ext',
      label: 'external design pressure',
      value: Pext,
      unit: u.pressure,
      source: conditionSource(el, 'externalPressure'),
    });

  // --- material and S
  let material: Material | null = null;
  if (cond.material !== undefined) {
    const m = findMaterial(cond.material);
    if (!m)
      issues.push({
        path: conditionPath(el, index, 'material'),
        message: `material "${cond.material}" is not in the materials library`,
      });
    else material = m;
  }
  let S: number | undefined;
  if (cond.allowableStress !== undefined) {
    S = cond.allowableStress;
    if (full)
      add({
        symbol: 'S',
        label: 'allowable stress',
        value: S,
        unit: u.pressure,
        source: conditionSource(el, 'allowableStress'),
      });
    // The element names its own material but its S is the spool's explicit value: say so.
    const own = el.conditions;
    if (
      own?.material !== undefined &&
      own.allowableStress === undefined &&
      doc.conditions.allowableStress !== undefined &&
      !sameMaterial(own.material, doc.conditions.material, findMaterial)
    ) {
      notes.push({
        level: 'warning',
        code: SPOOL_STRESS_CODE,
        text: full
          ? `this element's material ${material?.id ?? own.material} differs from the spool's (${doc.conditions.material ?? 'none given'}), but its allowable stress S = ${fmt(S)} ${u.pressure} is the spool's explicit value, not ${material?.id ?? own.material}'s tabulated stress: give the element its own allowableStress, or remove the spool's to use the material tables`
          : '',
      });
    }
  } else if (material) {
    const r = allowableStressAt(material, tempF);
    if (!r.ok)
      issues.push({
        path: conditionPath(el, index, 'temperature'),
        message: `${material.id}: ${r.reason}`,
      });
    else {
      S = pressureFromPsi(r.value, units);
      if (r.fromMemory) memorySymbols.push('S');
      if (full)
        add({
          symbol: 'S',
          label: `allowable stress, ${material.id} at ${fmt(cond.temperature)} ${u.temperature}`,
          value: S,
          unit: u.pressure,
          source: r.source,
          fromMemory: r.fromMemory,
        });
    }
  }
  // Lower temperature bound: a material's listed minimum is checked by allowableStressAt; one
  // without a listed minimum is bounded by the lowest temperature its tables cover (the B31.3
  // Table C-6 modulus row, which starts at −325 °F), so nothing colder passes unnoticed.
  if (
    material &&
    material.minTempF === undefined &&
    !issues.some((i) => i.path.endsWith('temperature'))
  ) {
    const lowest = MODULUS_TABLE[material.modulusGroup]?.[0]?.tempF;
    if (lowest !== undefined && tempF < lowest) {
      issues.push({
        path: conditionPath(el, index, 'temperature'),
        message: `${material.id}: ${fmt(cond.temperature)} ${u.temperature} is below the lowest temperature its tables cover (${fmt(lowest)} °F, ${MODULUS_SOURCE}) and no minimum temperature is held for it; see B31.3 para. 323.2.2`,
      });
    }
  }
  if (material?.minTempF !== undefined && tempF < material.minTempF) {
    notes.push({
      level: 'warning',
      code: 'below-min-temperature',
      text: full
        ? `design temperature is below ${material.id}'s minimum temperature without impact testing (${fmt(material.minTempF)} °F); B31.3 Chapter III impact-test rules apply`
        : '',
    });
  }

  // --- E, W, Y
  const form: ProductForm = cond.productForm ?? 'seamless';
  let E: number;
  if (cond.qualityFactor !== undefined) {
    E = cond.qualityFactor;
    if (full)
      add({
        symbol: 'E',
        label: 'quality factor',
        value: E,
        unit: '',
        source: conditionSource(el, 'qualityFactor'),
      });
  } else {
    const q = qualityFactorE(form);
    E = q.value;
    if (full)
      add({ symbol: 'E', label: `quality factor, ${form}`, value: E, unit: '', source: q.source });
    if (material && !material.productForms.includes(form)) {
      notes.push({
        level: 'warning',
        code: 'product-form',
        text: full
          ? `${material.id} is not made as ${form} pipe in its specification; check the product form`
          : '',
      });
    }
  }
  let W: number;
  if (cond.weldStrengthFactor !== undefined) {
    W = cond.weldStrengthFactor;
    if (full)
      add({
        symbol: 'W',
        label: 'weld joint strength reduction factor',
        value: W,
        unit: '',
        source: conditionSource(el, 'weldStrengthFactor'),
      });
  } else if (material) {
    const w = weldStrengthFactorW(material.wFamily, form, tempF);
    W = w.value;
    if (full)
      add({
        symbol: 'W',
        label: `weld joint strength reduction factor (${w.rule})`,
        value: W,
        unit: '',
        source: w.source,
      });
    if (W < 1 || w.rule.includes('not embedded')) {
      notes.push({
        level: 'warning',
        code: 'w-rule',
        text: full ? `W = ${fmt(W)}: ${w.rule}` : '',
      });
    }
  } else {
    W = 1;
    if (full)
      add({
        symbol: 'W',
        label: 'weld joint strength reduction factor',
        value: 1,
        unit: '',
        source:
          'assumed 1.0: no material given (set weldStrengthFactor for welded pipe at elevated temperature)',
      });
    if (form !== 'seamless')
      notes.push({
        level: 'warning',
        code: 'w-assumed',
        text: full ? 'W assumed 1.0 without a material; give weldStrengthFactor' : '',
      });
  }
  let Y: number;
  const yOverridden = cond.coefficientY !== undefined;
  if (cond.coefficientY !== undefined) {
    Y = cond.coefficientY;
    if (full)
      add({
        symbol: 'Y',
        label: 'coefficient Y',
        value: Y,
        unit: '',
        source: conditionSource(el, 'coefficientY'),
      });
  } else {
    const y = coefficientY(material?.yFamily ?? 'other', tempF);
    Y = y.value;
    if (full)
      add({
        symbol: 'Y',
        label: `coefficient Y (${material?.yFamily ?? 'other ductile metals'})`,
        value: Y,
        unit: '',
        source: y.source,
      });
  }

  // --- allowance and tolerance
  const ca = cond.corrosionAllowance ?? 0;
  if (full)
    add({
      symbol: 'c_a',
      label: 'corrosion/erosion allowance',
      value: ca,
      unit: u.length,
      source:
        cond.corrosionAllowance !== undefined
          ? conditionSource(el, 'corrosionAllowance')
          : 'default 0',
    });
  let tolFraction: number | null = null;
  let tolLength: number | null = null;
  let tolInput: SourcedValue | null = null;
  if (cond.millToleranceLength !== undefined) {
    tolLength = cond.millToleranceLength;
    if (full)
      tolInput = {
        symbol: 'tol',
        label: 'mill under-tolerance (fixed length)',
        value: tolLength,
        unit: u.length,
        source: conditionSource(el, 'millToleranceLength'),
      };
  } else {
    tolFraction = cond.millTolerance ?? MILL_TOLERANCE_DEFAULT;
    if (full)
      tolInput = {
        symbol: 'tol',
        label: 'mill under-tolerance (fraction of nominal)',
        value: tolFraction,
        unit: '',
        source:
          cond.millTolerance !== undefined
            ? conditionSource(el, 'millTolerance')
            : 'default 12.5 % (ASTM A530/A999 for A106, A53, A312)',
      };
  }

  // --- external pressure inputs (used only where the element has a diameter)
  let Ey: number | undefined;
  let Sy: number | undefined;
  let L: number | undefined;
  if (Pext > 0) {
    if (cond.elasticModulus !== undefined) {
      Ey = cond.elasticModulus;
      if (full)
        extInputs.push({
          symbol: 'E_y',
          label: 'elastic modulus',
          value: Ey,
          unit: u.pressure,
          source: conditionSource(el, 'elasticModulus'),
        });
    } else if (material) {
      const r = elasticModulusAt(material.modulusGroup, tempF);
      if (!r.ok)
        extIssues.push({
          path: conditionPath(el, index, 'elasticModulus'),
          message: `${material.id}: ${r.reason}`,
        });
      else {
        Ey = pressureFromPsi(r.value, units);
        if (r.fromMemory) extMemorySymbols.push('E_y');
        if (full)
          extInputs.push({
            symbol: 'E_y',
            label: 'elastic modulus at temperature',
            value: Ey,
            unit: u.pressure,
            source: r.source,
            fromMemory: r.fromMemory,
          });
      }
    } else
      extIssues.push({
        path: conditionPath(el, index, 'elasticModulus'),
        message: 'external pressure needs elasticModulus (or a material)',
      });
    if (cond.yieldStrength !== undefined) {
      Sy = cond.yieldStrength;
      if (full)
        extInputs.push({
          symbol: 'S_y',
          label: 'yield strength',
          value: Sy,
          unit: u.pressure,
          source: conditionSource(el, 'yieldStrength'),
        });
    } else if (material) {
      const r = yieldStrengthAt(material, tempF);
      if (r.ok) {
        Sy = pressureFromPsi(r.value, units);
        if (r.fromMemory) extMemorySymbols.push('S_y');
        if (full)
          extInputs.push({
            symbol: 'S_y',
            label: 'yield strength at temperature',
            value: Sy,
            unit: u.pressure,
            source: r.source,
            fromMemory: r.fromMemory,
          });
      } else if (S !== undefined) {
        // Lower bound from the Table A-1 basis (para. 302.3.2): S ≤ 2/3·Sy(T), or ≤ 0.9·Sy(T) for austenitic steels.
        const k = material.yFamily === 'austenitic' ? 1 / 0.9 : 1.5;
        Sy = Math.min(pressureFromPsi(material.yieldPsi, units), k * S);
        if (full)
          extInputs.push({
            symbol: 'S_y',
            label: 'yield strength at temperature (lower bound)',
            value: Sy,
            unit: u.pressure,
            source: `min(specified minimum yield, ${material.yFamily === 'austenitic' ? 'S/0.9' : '1.5·S'}) from the Table A-1 stress basis (para. 302.3.2); give yieldStrength for the tabulated value`,
          });
        extNotes.push({
          level: 'info',
          code: 'yield-lower-bound',
          text: full ? `${material.id} has no yield table: Sy taken as a lower bound from S` : '',
        });
      }
    } else if (S !== undefined) {
      Sy = 1.5 * S;
      if (full)
        extInputs.push({
          symbol: 'S_y',
          label: 'yield strength (lower bound)',
          value: Sy,
          unit: u.pressure,
          source: '1.5·S from the Table A-1 stress basis (para. 302.3.2); give yieldStrength',
        });
    }
    if (cond.stiffenedLength !== undefined) L = cond.stiffenedLength;
  }

  const externalWalls = !full && Pext > 0 ? new Map<number, [number, number, number]>() : null;
  return {
    cond,
    issues,
    extIssues,
    tempF,
    P,
    Pext,
    material,
    S,
    E,
    W,
    Y,
    yOverridden,
    ca,
    tolFraction,
    tolLength,
    Ey,
    Sy,
    L,
    notes,
    extNotes,
    memorySymbols,
    extMemorySymbols,
    inputs,
    tolInput,
    extInputs,
    externalWalls,
  };
}

/** Two material names denote the same material when they resolve to the same row (or read the same). */
function sameMaterial(a: string, b: string | undefined, findMaterial: MaterialFinder): boolean {
  if (b === undefined) return false;
  if (a === b) return true;
  const ma = findMaterial(a);
  const mb = findMaterial(b);
  return ma !== undefined && ma === mb;
}

/**
 * Resolve an element's inputs: pipe size from ASME B36.10M/B36.19M, S/E/W/Y from the B31.3 tables,
 * allowances and tolerances. Problems that make the element uncheckable come back as field issues.
 *
 * With `cache` (the numbers-only path) no input list or note text is built, and the
 * condition-derived inputs are computed once per conditions object; the numbers are the same.
 */
export function resolveElement(
  doc: SpoolDocument,
  el: SpoolElement,
  index: number,
  findMaterial: MaterialFinder = findLibraryMaterial,
  cache?: ResolveCache,
): ResolveResult {
  const full = cache === undefined;
  const units = doc.units;
  const u = UNIT_LABELS[units];
  const issues: FieldIssue[] = [];
  const inputs: SourcedValue[] = full ? [] : NO_INPUTS;

  // --- pipe size
  let nps: string | null = null;
  let schedule: string | null = null;
  let D: number | undefined;
  let T: number | undefined;
  let dimSource = '';
  if (el.nps !== undefined) {
    const n = typeof el.nps === 'string' && isCanonicalNps(el.nps) ? el.nps : normalizeNps(el.nps);
    if (n === undefined)
      issues.push({
        path: elementPath(index, 'nps'),
        message: `NPS ${String(el.nps)} is not a size listed in ASME B36.10M/B36.19M`,
      });
    else nps = n;
  }
  if (el.schedule !== undefined && el.nominalWall === undefined) {
    const s =
      typeof el.schedule === 'string' && isCanonicalSchedule(el.schedule)
        ? el.schedule
        : normalizeSchedule(el.schedule);
    if (s === undefined)
      issues.push({
        path: elementPath(index, 'schedule'),
        message: `schedule "${el.schedule}" is not known (use 10, 20, 30, 40, 60, 80, 100, 120, 140, 160, STD, XS, XXS, 5S, 10S, 40S, 80S)`,
      });
    else schedule = s;
  }
  if (nps !== null && schedule !== null) {
    const wall = getPipeWall(nps, schedule);
    if (!wall) {
      issues.push({
        path: elementPath(index, 'schedule'),
        message: `NPS ${nps} has no schedule ${schedule} in ASME ${scheduleStandard(schedule)}`,
      });
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
  } else if (
    nps === null &&
    el.schedule !== undefined &&
    el.nominalWall === undefined &&
    el.nps === undefined
  ) {
    issues.push({
      path: elementPath(index, 'schedule'),
      message: 'a schedule needs nps; give nominalWall with outsideDiameter',
    });
  }
  let d: number | null = null;
  if (el.outsideDiameter !== undefined) {
    D = el.outsideDiameter;
    dimSource = 'element outsideDiameter';
  }
  if (el.nominalWall !== undefined) T = el.nominalWall;
  if (el.insideDiameter !== undefined) {
    if (T === undefined)
      issues.push({
        path: elementPath(index, 'nominalWall'),
        message: 'insideDiameter needs a nominal wall (schedule or nominalWall)',
      });
    else {
      d = el.insideDiameter;
      if (el.outsideDiameter === undefined && el.nps === undefined) {
        D = d + 2 * T;
        dimSource = 'insideDiameter + 2·nominalWall';
      } else if (D !== undefined && Math.abs(D - 2 * T - d) > 1e-6 * D) {
        issues.push({
          path: elementPath(index, 'insideDiameter'),
          message: `insideDiameter ${fmt(d)} ${u.length} does not equal D − 2T = ${fmt(D - 2 * T)} ${u.length}`,
        });
      }
    }
  }
  if (D !== undefined && T !== undefined && T >= D / 2) {
    issues.push({
      path: elementPath(index, el.nominalWall !== undefined ? 'nominalWall' : 'schedule'),
      message: `nominal wall ${fmt(T)} ${u.length} is not less than half the outside diameter ${fmt(D)} ${u.length}`,
    });
  }
  if (full) {
    if (D !== undefined)
      inputs.push({
        symbol: 'D',
        label: 'outside diameter',
        value: D,
        unit: u.length,
        source: dimSource,
      });
    if (T !== undefined)
      inputs.push({
        symbol: 'T',
        label: 'nominal wall',
        value: T,
        unit: u.length,
        source: el.nominalWall !== undefined ? 'element nominalWall' : dimSource,
      });
    if (d !== null)
      inputs.push({
        symbol: 'd',
        label: 'inside diameter',
        value: d,
        unit: u.length,
        source: 'element insideDiameter',
      });
  }

  // --- everything the conditions decide (once per conditions object on the numbers-only path)
  let cp: ConditionPart;
  if (cache) {
    const key = el.conditions ?? doc.conditions;
    const hit = cache.get(key);
    if (hit) cp = hit;
    else {
      cp = resolveConditions(doc, el, index, findMaterial, false);
      cache.set(key, cp);
    }
  } else cp = resolveConditions(doc, el, index, findMaterial, true);
  const cond = cp.cond;
  for (const i of cp.issues) issues.push(i);
  if (full) for (const i of cp.inputs) inputs.push(i);
  // Shared with the cached condition part until this element adds its own (copy on write).
  let notes: ResolveNote[] = cp.notes;
  let memorySymbols: string[] = cp.memorySymbols;

  const { material, S } = cp;

  // --- thread or groove depth
  let c = cp.ca;
  if (el.kind === 'straight' && el.endType === 'threaded') {
    const npsValue = nps !== null ? npsToNumber(nps) : undefined;
    if (npsValue === undefined)
      issues.push({
        path: elementPath(index, 'endType'),
        message: 'threaded ends need nps to find the thread depth',
      });
    else {
      const th = threadDepth(npsValue);
      const h = lengthFromInches(th.inches, units);
      c += h;
      if (full)
        inputs.push({
          symbol: 'h',
          label: `NPT thread depth (${th.threadsPerInch} threads/in)`,
          value: h,
          unit: u.length,
          source: th.source,
        });
    }
  }
  if (el.kind === 'straight' && el.endType === 'grooved') {
    if (cond.grooveDepth === undefined)
      issues.push({
        path: conditionPath(el, index, 'grooveDepth'),
        message: 'grooved ends need grooveDepth',
      });
    else {
      const g = cond.grooveDepth + lengthFromInches(GROOVE_TOLERANCE_IN, units);
      c += g;
      memorySymbols = [...memorySymbols, 'g'];
      if (full)
        inputs.push({
          symbol: 'g',
          label: 'groove depth + 0.02 in tolerance',
          value: g,
          unit: u.length,
          source:
            'groove depth from conditions; +0.02 in (0.5 mm) where no tolerance is stated [from memory]',
          fromMemory: true,
        });
    }
  }
  if (full && cp.tolInput) inputs.push(cp.tolInput);

  // --- bend geometry
  let bend: ResolvedElement['bend'] = null;
  if (el.kind === 'bend' && D !== undefined) {
    // "3D bend" in shop practice means R1 = 3 × nominal size [common practice]; D itself where no NPS.
    const nominalSize = nps !== null ? lengthFromInches(npsToNumber(nps), units) : D;
    const multiple = typeof el.bendRadius === 'number' ? null : el.bendRadius.multipleOfD;
    const R1 = multiple === null ? (el.bendRadius as number) : multiple * nominalSize;
    if (full) {
      inputs.push({
        symbol: 'R1',
        label: 'bend radius (centreline)',
        value: R1,
        unit: u.length,
        source:
          multiple === null
            ? 'element bendRadius'
            : `${fmt(multiple)} × nominal size ${fmt(nominalSize)} ${u.length} (common practice: "nD" = n × NPS)`,
      });
    }
    if (R1 / D <= 0.5) {
      issues.push({
        path: elementPath(index, 'bendRadius'),
        message: `R1/D = ${fmt(R1 / D)} must exceed 0.5 for Eq. (3d)`,
      });
    } else if (R1 < 1.5 * D) {
      notes = [
        ...notes,
        {
          level: 'warning',
          code: 'tight-bend',
          text: full
            ? `R1 = ${fmt(R1 / D)}·D is under 1.5·D: such tight bends are normally elbows, not pipe bends`
            : '',
        },
      ];
    }
    bend = { R1, nominalSize, angle: el.angle, multiple };
  }

  // --- external pressure inputs
  let external: ResolvedElement['external'] = null;
  if (cp.Pext > 0 && D !== undefined) {
    for (const i of cp.extIssues) issues.push(i);
    if (full) for (const i of cp.extInputs) inputs.push(i);
    if (cp.extNotes.length > 0) notes = [...notes, ...cp.extNotes];
    if (cp.extMemorySymbols.length > 0) memorySymbols = [...memorySymbols, ...cp.extMemorySymbols];
    let L: number;
    let longCylinder = false;
    if (cp.L !== undefined) {
      L = cp.L;
      if (full)
        inputs.push({
          symbol: 'L',
          label: 'design length between stiffeners',
          value: L,
          unit: u.length,
          source: conditionSource(el, 'stiffenedLength'),
        });
    } else {
      L = 50 * D;
      longCylinder = true;
      if (full)
        inputs.push({
          symbol: 'L',
          label: 'design length between stiffeners',
          value: L,
          unit: u.length,
          source: 'not given: treated as a long cylinder (L/Do = 50, conservative)',
        });
      notes = [
        ...notes,
        {
          level: 'info',
          code: 'long-cylinder',
          text: full ? 'no stiffenedLength: external pressure checked as a long cylinder' : '',
        },
      ];
    }
    if (cp.Ey !== undefined && cp.Sy !== undefined)
      external = { L, longCylinder, Ey: cp.Ey, Sy: cp.Sy };
  }

  if (
    S === undefined &&
    !issues.some((i) => i.path.endsWith('material') || i.path.endsWith('temperature'))
  ) {
    issues.push({
      path: conditionPath(el, index, 'material'),
      message: 'give material or allowableStress',
    });
  }
  if (D === undefined && issues.length === 0)
    issues.push({
      path: elementPath(index, 'nps'),
      message: 'outside diameter could not be found',
    });
  if (T === undefined && issues.length === 0)
    issues.push({
      path: elementPath(index, 'schedule'),
      message: 'nominal wall could not be found',
    });
  if (issues.length > 0 || D === undefined || T === undefined || S === undefined)
    return { ok: false, issues };

  // Own standard: the schedule's; for a bare wall, stainless materials read B36.19M.
  const austenitic = material?.category === 'austenitic';
  const standard: PipeStandard =
    schedule !== null ? scheduleStandard(schedule) : austenitic ? 'B36.19M' : 'B36.10M';
  const stainless = standard === 'B36.19M' || austenitic;
  const { P, Pext, tempF, E, W, Y, yOverridden, tolFraction, tolLength } = cp;
  return {
    ok: true,
    value: {
      element: el,
      index,
      nps,
      schedule,
      standard,
      stainless,
      D,
      T,
      P,
      Pext,
      tempF,
      S,
      E,
      W,
      Y,
      yOverridden,
      c,
      tolFraction,
      tolLength,
      external,
      d,
      bend,
      material,
      inputs,
      notes,
      memorySymbols,
      externalWalls: cp.externalWalls,
    },
  };
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  const out: Partial<T> = {};
  for (const [k, v] of Object.entries(o))
    if (v !== undefined) (out as Record<string, unknown>)[k] = v;
  return out;
}
