/**
 * The fabrication sheet of a spool, from its document and its check: bend list (pipe to order
 * before bending, walls expected after bending), cut list (cut lengths, bend arcs, end
 * preparation, butt welds), bill of materials with masses, spool masses and the hydrotest.
 * Pure and deterministic; lengths, walls and pressures in the document's units, masses in
 * lb | kg. Numbers about walls come from the check engine's results (ElementCheck and its
 * preBend), so the engine's rules flow through unchanged.
 */
import { densityOf, WATER_DENSITY, type Density } from '../data/densities';
import { findMaterial as findLibraryMaterial, type Material } from '../data/materials';
import { getPipeWall, normalizeNps, normalizeSchedule } from '../data/pipe-dimensions';
import type { ElementCheck, MaterialFinder, SpoolCheck } from '../engine/index';
import { fmt } from '../engine/format';
import { CAUTION } from '../model/caution';
import {
  DEFAULT_TEST_TEMPERATURE,
  type EndType,
  type SpoolDocument,
  type SpoolElement,
  type UnitSystem,
} from '../model/spool';
import { UNIT_LABELS } from '../units/units';
import { bendArcLength, bendTangentLength } from './geometry';
import { computeHydrotest, type Hydrotest, type HydrotestElementInput } from './hydrotest';
import { contentMassPerLength, pipeMassPerLength, pipeMassPerRun } from './mass';

/** Flattening note of B31.3 para. 332.2.1 (as the check engine words the rule). */
export const FLATTENING_NOTE =
  'Flattening (max OD − min OD) at most 8 % of nominal OD for internal pressure, 3 % for external pressure (B31.3 para. 332.2.1, from memory): verify at fabrication.';

export interface ShopBend {
  readonly angle: number;
  /** Centreline radius R1. */
  readonly radius: number;
  /** R1 / outside diameter (B31.3 Eqs. 3d/3e). */
  readonly radiusOverD: number;
  /** R1 / nominal size (the "nD" of shop practice, B31.1 Table 102.4.5 index). */
  readonly radiusOverNps: number;
  readonly tableFactor: number | null;
  /** Minimum wall before bending from the table factor, and from the geometric estimate. */
  readonly tableWall: number | null;
  readonly geometricWall: number;
  /** The larger of the two: the minimum wall the bend pipe needs before bending. */
  readonly wallBeforeBending: number;
  readonly governingEstimate: 'table' | 'geometric';
  /** Wall required at the extrados / intrados after bending (tm of those cases). */
  readonly extradosWallRequired: number | null;
  readonly intradosWallRequired: number | null;
  /** Wall expected after bending, of the pipe as ordered less mill under-tolerance. */
  readonly extradosWallAfter: number;
  readonly intradosWallAfter: number;
  /** The chosen schedule is lighter than the wall needed before bending. */
  readonly orderHeavier: boolean;
  /** R1·θ. */
  readonly arcLength: number;
  /** R1·tan(θ/2), taken from each leg. */
  readonly tangent: number;
  /** Straight the shop adds at each end for the bending machine (spool setting). */
  readonly bendingTangent: number;
  readonly flattening: string;
}

export interface EndPrep {
  /** 'joint': butt or other joint to the neighbouring element; 'free': a spool end. */
  readonly at: 'joint' | 'free';
  /** Id of the element on the other side of a joint. */
  readonly to: string | null;
  readonly prep: EndType;
  /** e.g. "bevel, butt weld to B1", "threaded (spool end)". */
  readonly text: string;
}

export interface ShopElement {
  readonly id: string;
  readonly kind: SpoolElement['kind'];
  readonly index: number;
  readonly status: ElementCheck['status'];
  readonly nps: string | null;
  readonly outsideDiameter: number;
  /** Chosen schedule and wall (as designed). */
  readonly schedule: string | null;
  readonly nominalWall: number;
  /** Schedule and nominal wall to order (bends: heavier where bending needs it). null schedule: order by wall. */
  readonly orderSchedule: string | null;
  readonly orderWall: number;
  readonly material: string | null;
  readonly density: Density;
  /** Mass per run (lb/ft | kg/m) of the pipe as ordered. */
  readonly massPerRun: number;
  /** Length of pipe to cut: straights their length; bends the arc plus a bending tangent at each end. */
  readonly cutLength: number;
  /** Mass of the cut length as ordered (lb | kg). */
  readonly mass: number;
  /** Straights: the tangents R·tan(θ/2) the bends beside it take from its leg (0 where none). */
  readonly tangentBefore: number;
  readonly tangentAfter: number;
  readonly ends: readonly [EndPrep, EndPrep];
  readonly bend?: ShopBend;
  readonly notes: readonly string[];
}

export interface BomLine {
  readonly nps: string | null;
  readonly outsideDiameter: number;
  readonly schedule: string | null;
  readonly wall: number;
  readonly material: string | null;
  /** Pipe length to order (document length units) and its mass (lb | kg). */
  readonly length: number;
  readonly mass: number;
  readonly massPerRun: number;
  readonly pieces: number;
  readonly elements: readonly string[];
}

export interface FabricationSheet {
  readonly units: UnitSystem;
  readonly name: string | null;
  readonly line: string | null;
  readonly elements: readonly ShopElement[];
  /** Elements that could not be checked (no sheet row): id and why. */
  readonly skipped: readonly { id: string; reason: string }[];
  readonly bom: readonly BomLine[];
  /** Butt welds between elements. */
  readonly welds: number;
  /** Other joints (threaded, grooved, plain-end) between elements. */
  readonly otherJoints: number;
  /** Σ straight lengths + Σ bend arcs. */
  readonly developedLength: number;
  /** Σ of every piece's cut length (pipe to order). */
  readonly orderLength: number;
  /** Spool as built (developed length, ordered walls), empty and full of water (lb | kg). */
  readonly totalMass: number;
  readonly filledMass: number;
  readonly waterDensity: Density;
  readonly settings: { readonly testTemperature: number; readonly bendTangent: number };
  readonly hydrotest: Hydrotest | null;
  readonly notes: readonly string[];
  readonly caution: string;
}

export interface FabricationOptions {
  /** Team/project materials, as passed to the check. */
  readonly findMaterial?: MaterialFinder;
}

function inputValue(check: ElementCheck, symbol: string): number | undefined {
  return check.inputs.find((i) => i.symbol === symbol)?.value;
}

/** Minimum wall of a nominal wall T after mill under-tolerance, as the check applied it. */
function minimumWallFor(check: ElementCheck, T: number): number {
  const tol = check.inputs.find((i) => i.symbol === 'tol');
  if (tol && tol.unit !== '') return Math.max(0, T - tol.value);
  const fraction = tol?.value ?? 0;
  return T * (1 - fraction);
}

function endTypeOf(el: SpoolElement | undefined): EndType | undefined {
  return el?.kind === 'straight' ? el.endType : undefined;
}

const isButtPrep = (t: EndType | undefined) => t === undefined || t === 'bevel';

function endPrep(el: SpoolElement, other: SpoolElement | undefined): EndPrep {
  const own = endTypeOf(el);
  if (!other) {
    const prep = own ?? 'bevel';
    return {
      at: 'free',
      to: null,
      prep,
      text: `${prep}${own === undefined ? ' (default)' : ''}, spool end`,
    };
  }
  const theirs = endTypeOf(other);
  if (isButtPrep(own) && isButtPrep(theirs))
    return { at: 'joint', to: other.id, prep: 'bevel', text: `bevel, butt weld to ${other.id}` };
  const prep = own !== undefined && !isButtPrep(own) ? own : (theirs as EndType);
  const what =
    prep === 'plain'
      ? 'plain end (socket or fillet-welded joint, not a butt weld)'
      : `${prep} joint`;
  return { at: 'joint', to: other.id, prep, text: `${what} to ${other.id}` };
}

function materialOf(
  doc: SpoolDocument,
  el: SpoolElement,
  find: MaterialFinder,
): { id: string | null; material: Material | null } {
  const id = el.conditions?.material ?? doc.conditions.material ?? null;
  if (id === null) return { id: null, material: null };
  const m = find(id) ?? null;
  return { id: m?.id ?? id, material: m };
}

/** Build the fabrication sheet of a spool from its document and its check (`checkSpool(doc, opts)`). */
export function buildFabricationSheet(
  doc: SpoolDocument,
  check: SpoolCheck,
  opts: FabricationOptions = {},
): FabricationSheet {
  const units = doc.units;
  const lu = UNIT_LABELS[units].length;
  const find = opts.findMaterial ?? findLibraryMaterial;
  const testTemperature = doc.shop?.testTemperature ?? DEFAULT_TEST_TEMPERATURE[units];
  const bendTangent = doc.shop?.bendTangent ?? 0;
  const notes: string[] = [];
  const skipped: { id: string; reason: string }[] = [];
  const elements: ShopElement[] = [];
  const hydroInputs: HydrotestElementInput[] = [];
  const tangentOf = new Map<number, number>();

  // Bend tangents first: straights need their neighbours'.
  doc.elements.forEach((el, i) => {
    const c = check.elements[i];
    if (el.kind !== 'bend' || !c || c.status === 'invalid') return;
    const R = inputValue(c, 'R1');
    if (R !== undefined) tangentOf.set(i, bendTangentLength(R, el.angle));
  });

  let developedLength = 0;
  let totalMass = 0;
  let waterMass = 0;
  doc.elements.forEach((el, i) => {
    const c = check.elements[i];
    if (!c || c.id !== el.id) {
      skipped.push({ id: el.id, reason: 'no check result for this element' });
      return;
    }
    if (c.status === 'invalid') {
      skipped.push({
        id: el.id,
        reason:
          c.inputIssues.map((x) => `${x.path}: ${x.message}`).join('; ') || 'cannot be checked',
      });
      return;
    }
    const elNotes: string[] = [];
    const nps = el.nps !== undefined ? (normalizeNps(el.nps) ?? null) : null;
    const schedule =
      el.nominalWall === undefined && el.schedule !== undefined
        ? (normalizeSchedule(el.schedule) ?? null)
        : null;
    const D = c.outsideDiameter;
    const T = c.nominalWall;
    const { id: materialId, material } = materialOf(doc, el, find);
    const density = densityOf(material);
    if (c.status === 'fail')
      elNotes.push('the wall check fails: not for fabrication until the design is corrected');
    if (c.status === 'review')
      elNotes.push('para. 304.1.2(b) special consideration needed before fabrication');

    let orderSchedule = schedule;
    let orderWall = T;
    let orderD = D;
    let bend: ShopBend | undefined;
    let cutLength: number;
    let builtLength: number;
    if (el.kind === 'bend') {
      const R = inputValue(c, 'R1') ?? 0;
      const pb = c.preBend;
      if (pb?.orderHeavier) {
        if (pb.orderSchedule && nps) {
          const w = getPipeWall(nps, pb.orderSchedule);
          orderSchedule = pb.orderSchedule;
          orderWall = w ? (units === 'metric' ? w.wallMm : w.wallIn) : pb.requiredOrderedWall;
          if (w) orderD = units === 'metric' ? w.odMm : w.odIn;
        } else {
          orderSchedule = null;
          orderWall = pb.requiredOrderedWall;
          elNotes.push(
            `no listed schedule gives the ${fmt(pb.requiredOrderedWall)} ${lu} needed before bending: order by wall`,
          );
        }
      }
      const tminOrdered = minimumWallFor(c, orderWall);
      const fExt = pb ? 1 - pb.extradosThinning : 1;
      const fInt = pb ? 1 + pb.intradosThickening : 1;
      const tableWall = pb?.tableWall ?? null;
      const geometricWall = pb?.geometricWall ?? 0;
      const arc = bendArcLength(R, el.angle);
      bend = {
        angle: el.angle,
        radius: R,
        radiusOverD: D > 0 ? R / D : 0,
        radiusOverNps: pb?.radiusRatio ?? (D > 0 ? R / D : 0),
        tableFactor: pb?.tableFactor ?? null,
        tableWall,
        geometricWall,
        wallBeforeBending: c.preBendWall ?? Math.max(geometricWall, tableWall ?? 0),
        governingEstimate: tableWall !== null && tableWall > geometricWall ? 'table' : 'geometric',
        extradosWallRequired: c.cases.find((k) => k.case === 'extrados')?.tm ?? null,
        intradosWallRequired: c.cases.find((k) => k.case === 'intrados')?.tm ?? null,
        extradosWallAfter: tminOrdered * fExt,
        intradosWallAfter: tminOrdered * fInt,
        orderHeavier: pb?.orderHeavier ?? false,
        arcLength: arc,
        tangent: tangentOf.get(i) ?? 0,
        bendingTangent: bendTangent,
        flattening: FLATTENING_NOTE,
      };
      if (bend.orderHeavier)
        elNotes.push(
          `order heavier than the straight pipe: ${fmt(pb?.requiredOrderedWall ?? orderWall)} ${lu} nominal needed before bending`,
        );
      if (pb && pb.tableFactor === null)
        elNotes.push('R/NPS below the 3D start of B31.1 Table 102.4.5: geometric estimate only');
      cutLength = arc + 2 * bendTangent;
      builtLength = arc;
    } else {
      cutLength = el.length;
      builtLength = el.length;
    }
    const perLength = pipeMassPerLength(orderD, orderWall, density.value, units);
    developedLength += builtLength;
    totalMass += perLength * builtLength;
    waterMass +=
      contentMassPerLength(Math.max(0, orderD - 2 * orderWall), WATER_DENSITY.value, units) *
      builtLength;
    if (density.fromMemory) elNotes.push(`density ${density.source}`);

    const prev = doc.elements[i - 1];
    const next = doc.elements[i + 1];
    elements.push({
      id: el.id,
      kind: el.kind,
      index: i,
      status: c.status,
      nps,
      outsideDiameter: orderD,
      schedule,
      nominalWall: T,
      orderSchedule,
      orderWall,
      material: materialId,
      density,
      massPerRun: pipeMassPerRun(orderD, orderWall, density.value, units),
      cutLength,
      mass: perLength * cutLength,
      tangentBefore:
        el.kind === 'straight' && prev?.kind === 'bend' ? (tangentOf.get(i - 1) ?? 0) : 0,
      tangentAfter:
        el.kind === 'straight' && next?.kind === 'bend' ? (tangentOf.get(i + 1) ?? 0) : 0,
      ends: [endPrep(el, prev), endPrep(el, next)],
      ...(bend ? { bend } : {}),
      notes: elNotes,
    });

    // The hydrotest looks at the thinnest wall: bends at the extrados after bending.
    const S = inputValue(c, 'S');
    if (S !== undefined && S > 0) {
      hydroInputs.push({
        id: el.id,
        pressure: el.conditions?.pressure ?? doc.conditions.pressure,
        S,
        material,
        yieldOverride: el.conditions?.yieldStrength ?? doc.conditions.yieldStrength,
        D: orderD,
        wall: bend ? bend.extradosWallAfter : minimumWallFor(c, orderWall),
        Y: inputValue(c, 'Y') ?? 0.4,
      });
    }
  });

  // Joints between consecutive elements (skipped elements still sit in the run).
  let welds = 0;
  let otherJoints = 0;
  for (let i = 1; i < doc.elements.length; i++) {
    const a = doc.elements[i - 1]!;
    const b = doc.elements[i]!;
    if (isButtPrep(endTypeOf(a)) && isButtPrep(endTypeOf(b))) welds++;
    else otherJoints++;
  }

  // Bill of materials by NPS (or OD), schedule as ordered (or wall) and material.
  const groups = new Map<
    string,
    {
      line: Omit<BomLine, 'length' | 'mass' | 'pieces' | 'elements'>;
      length: number;
      mass: number;
      ids: string[];
    }
  >();
  for (const e of elements) {
    const key = [
      e.nps ?? `D${e.outsideDiameter}`,
      e.orderSchedule ?? `T${e.orderWall}`,
      e.material ?? '',
      e.density.value,
    ].join('|');
    const g = groups.get(key) ?? {
      line: {
        nps: e.nps,
        outsideDiameter: e.outsideDiameter,
        schedule: e.orderSchedule,
        wall: e.orderWall,
        material: e.material,
        massPerRun: e.massPerRun,
      },
      length: 0,
      mass: 0,
      ids: [],
    };
    g.length += e.cutLength;
    g.mass += e.mass;
    g.ids.push(e.id);
    groups.set(key, g);
  }
  const bom: BomLine[] = [...groups.values()]
    .map((g) => ({
      ...g.line,
      length: g.length,
      mass: g.mass,
      pieces: g.ids.length,
      elements: g.ids,
    }))
    .sort(
      (x, y) =>
        x.outsideDiameter - y.outsideDiameter ||
        x.wall - y.wall ||
        String(x.material).localeCompare(String(y.material)),
    );

  if (skipped.length > 0)
    notes.push(
      `${skipped.length} element(s) cannot be checked and are left out of the lists and totals: ${skipped.map((s) => s.id).join(', ')}`,
    );
  if (bendTangent > 0)
    notes.push(
      `bend pipe is cut with ${fmt(bendTangent)} ${lu} of straight at each end for the bending machine, trimmed after bending (not in the spool mass)`,
    );

  const hydrotest =
    hydroInputs.length > 0
      ? computeHydrotest(hydroInputs, doc.conditions.pressure, testTemperature, units)
      : null;

  return {
    units,
    name: doc.name ?? null,
    line: doc.line ?? null,
    elements,
    skipped,
    bom,
    welds,
    otherJoints,
    developedLength,
    orderLength: elements.reduce((s, e) => s + e.cutLength, 0),
    totalMass,
    filledMass: totalMass + waterMass,
    waterDensity: WATER_DENSITY,
    settings: { testTemperature, bendTangent },
    hydrotest,
    notes,
    caution: CAUTION,
  };
}
