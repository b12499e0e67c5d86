/**
 * Hydrostatic leak test, ASME B31.3 para. 345.4.2:
 * (a) PT = 1.5·P·ST/S with ST/S capped at 6.5 — P the internal design gauge pressure, ST the
 *     allowable stress at test temperature, S at design temperature; where the system holds
 *     several materials, the lowest ratio governs [from memory, as commonly applied];
 * (c) where PT would produce a nominal pressure stress above yield at test temperature, PT may
 *     be reduced to the largest pressure that does not.
 * The nominal pressure stress here is the hoop stress of the Eq. (3a) form with S·E·W → Sy,
 * on the thinnest wall the element is expected to have (nominal as ordered less mill
 * under-tolerance; bends: the extrados after bending), without corrosion allowance (new pipe).
 */
import type { Material } from '../data/materials';
import { allowableStressAt, yieldStrengthAt } from '../data/materials';
import type { UnitSystem } from '../model/spool';
import { fmt } from '../engine/format';
import { pressureFromPsi, temperatureToF, UNIT_LABELS } from '../units/units';

/** ST/S cap of para. 345.4.2(b). */
export const HYDROTEST_RATIO_CAP = 6.5;

export const HYDROTEST_CAUTION =
  'The test pressure is set by the owner and the code edition in force (B31.3 para. 345); this is the para. 345.4.2 ' +
  'value for the design conditions entered, to be verified before any test.';

export interface HydrotestElementInput {
  readonly id: string;
  /** Internal design pressure of the element (document units). */
  readonly pressure: number;
  /** Allowable stress at design temperature as the check used it (document units). */
  readonly S: number;
  readonly material: Material | null;
  /** Yield strength override from the conditions (document units), used only when the material has none. */
  readonly yieldOverride?: number;
  readonly D: number;
  /** Thinnest wall expected in the element at test (document units). */
  readonly wall: number;
  /** Coefficient Y as the check used it. */
  readonly Y: number;
}

export interface HydrotestElement {
  readonly id: string;
  /** ST at test temperature (document units). */
  readonly ST: number;
  readonly S: number;
  /** ST/S, capped at 6.5. */
  readonly ratio: number;
  readonly ratioCapped: boolean;
  readonly stSource: string;
  /** Yield strength at test temperature and the pressure that brings the nominal stress to it (null: yield unknown). */
  readonly Sy: number | null;
  readonly sySource: string | null;
  readonly yieldPressure: number | null;
  /** ST / Sy (or either) recalled from memory. */
  readonly stFromMemory: boolean;
  readonly syFromMemory: boolean;
  readonly fromMemory: boolean;
}

export interface Hydrotest {
  /** Test pressure to apply (document units): PT, or the reduced pressure of 345.4.2(c). */
  readonly pressure: number;
  /** PT of 345.4.2(a)/(b) before any reduction. */
  readonly unreducedPressure: number;
  /** Design pressure P the test pressure is based on. */
  readonly designPressure: number;
  /** Governing (lowest) ST/S. */
  readonly ratio: number;
  /** Element with the lowest ST/S. */
  readonly governing: string | null;
  /** Element whose yield at test temperature limits PT (345.4.2(c)), or null. */
  readonly limitedBy: string | null;
  readonly testTemperature: number;
  /** The substituted equation(s), in document units. */
  readonly equation: string;
  readonly elements: readonly HydrotestElement[];
  readonly notes: readonly string[];
  readonly caution: string;
}

/** Nominal hoop stress of the Eq. (3a) form reaching Sy: P = 2·Sy·t / (D − 2·Y·t). */
export function yieldLimitedPressure(Sy: number, D: number, t: number, Y: number): number {
  if (t <= 0) return 0;
  const den = D - 2 * Y * t;
  return den > 0 ? (2 * Sy * t) / den : Number.POSITIVE_INFINITY;
}

function stAtTest(
  el: HydrotestElementInput,
  testF: number,
  units: UnitSystem,
  notes: string[],
): { ST: number; source: string; fromMemory: boolean } {
  if (!el.material) {
    notes.push(
      `${el.id}: no material table (allowable stress given directly); ST/S taken as 1.0 — give a material for the 345.4.2 ratio`,
    );
    return { ST: el.S, source: 'taken equal to S (no material table)', fromMemory: false };
  }
  const r = allowableStressAt(el.material, testF);
  if (!r.ok) {
    notes.push(`${el.id}: ${r.reason}; ST/S taken as 1.0`);
    return {
      ST: el.S,
      source: 'taken equal to S (no value at test temperature)',
      fromMemory: false,
    };
  }
  return { ST: pressureFromPsi(r.value, units), source: r.source, fromMemory: r.fromMemory };
}

function syAtTest(
  el: HydrotestElementInput,
  testF: number,
  units: UnitSystem,
): { Sy: number; source: string; fromMemory: boolean } | null {
  if (el.material) {
    const r = yieldStrengthAt(el.material, testF);
    if (r.ok)
      return { Sy: pressureFromPsi(r.value, units), source: r.source, fromMemory: r.fromMemory };
    return {
      Sy: pressureFromPsi(el.material.yieldPsi, units),
      source: `${el.material.id} specified minimum yield (room temperature; no yield table held)`,
      fromMemory: false,
    };
  }
  if (el.yieldOverride !== undefined)
    return { Sy: el.yieldOverride, source: 'yieldStrength from the conditions', fromMemory: false };
  return null;
}

/** The 345.4.2 hydrotest pressure of a spool (document units). */
export function computeHydrotest(
  elements: readonly HydrotestElementInput[],
  designPressure: number,
  testTemperature: number,
  units: UnitSystem,
): Hydrotest {
  const u = UNIT_LABELS[units];
  const testF = temperatureToF(testTemperature, units);
  const notes: string[] = [];
  // Table lookups depend only on the material (and S for the fallback): once per material, not per element.
  const cache = new Map<
    Material,
    { st: ReturnType<typeof stAtTest>; sy: ReturnType<typeof syAtTest> }
  >();
  const lookups = (el: HydrotestElementInput) => {
    if (!el.material)
      return { st: stAtTest(el, testF, units, notes), sy: syAtTest(el, testF, units) };
    let hit = cache.get(el.material);
    if (!hit) {
      hit = { st: stAtTest(el, testF, units, notes), sy: syAtTest(el, testF, units) };
      cache.set(el.material, hit);
    }
    return hit.st.source.startsWith('taken equal to S')
      ? { st: { ...hit.st, ST: el.S }, sy: hit.sy }
      : hit;
  };
  const rows: HydrotestElement[] = elements.map((el) => {
    const { st, sy } = lookups(el);
    const raw = st.ST / el.S;
    const ratio = Math.min(raw, HYDROTEST_RATIO_CAP);
    if (!sy)
      notes.push(
        `${el.id}: no yield strength known; the 345.4.2(c) yield limit is not checked for it`,
      );
    return {
      id: el.id,
      ST: st.ST,
      S: el.S,
      ratio,
      ratioCapped: raw > HYDROTEST_RATIO_CAP,
      stSource: st.source,
      Sy: sy?.Sy ?? null,
      sySource: sy?.source ?? null,
      yieldPressure: sy ? yieldLimitedPressure(sy.Sy, el.D, el.wall, el.Y) : null,
      stFromMemory: st.fromMemory,
      syFromMemory: sy?.fromMemory ?? false,
      fromMemory: st.fromMemory || (sy?.fromMemory ?? false),
    };
  });
  if (
    elements.some((e) => Math.abs(e.pressure - designPressure) > 1e-9 * Math.max(1, designPressure))
  ) {
    notes.push(
      'some elements carry their own design pressure: the test pressure here uses the spool design pressure; test or verify those elements separately',
    );
  }
  let gov: HydrotestElement | undefined;
  for (const r of rows) if (!gov || r.ratio < gov.ratio - 1e-12) gov = r;
  const ratio = gov?.ratio ?? 1;
  const unreduced = 1.5 * designPressure * ratio;
  let limit: HydrotestElement | undefined;
  for (const r of rows)
    if (r.yieldPressure !== null && (!limit || r.yieldPressure < (limit.yieldPressure ?? Infinity)))
      limit = r;
  const limited =
    limit !== undefined && limit.yieldPressure !== null && limit.yieldPressure < unreduced;
  const pressure = limited ? (limit!.yieldPressure as number) : unreduced;
  let equation = gov
    ? `PT = 1.5·P·ST/S = 1.5 × ${fmt(designPressure)} × (${fmt(gov.ST)} / ${fmt(gov.S)}${gov.ratioCapped ? ', capped at 6.5' : ''}) = ${fmt(unreduced)} ${u.pressure} (B31.3 para. 345.4.2, ${gov.id} governs)`
    : `PT = 1.5·P = ${fmt(unreduced)} ${u.pressure}`;
  if (limited && limit) {
    equation += `; reduced per 345.4.2(c): P = 2·Sy·t / (D − 2·Y·t) at yield in ${limit.id} = ${fmt(pressure)} ${u.pressure}`;
  }
  if (designPressure <= 0)
    notes.push(
      'the internal design pressure is 0: para. 345.4.2 gives no test pressure; piping under external pressure is tested at 1.5 × the external differential pressure, at least 15 psi (105 kPa) (para. 345.2.4, from memory): the owner sets the test',
    );
  if (rows.some((r) => r.ratioCapped))
    notes.push('ST/S above 6.5 is capped at 6.5 (para. 345.4.2(b))');
  if (rows.some((r) => r.fromMemory))
    notes.push(
      'uses stress or yield values recalled from memory: verify against the licensed edition',
    );
  return {
    pressure,
    unreducedPressure: unreduced,
    designPressure,
    ratio,
    governing: gov?.id ?? null,
    limitedBy: limited && limit ? limit.id : null,
    testTemperature,
    equation,
    elements: rows,
    notes: [...new Set(notes)],
    caution: HYDROTEST_CAUTION,
  };
}
