/**
 * ASME B31.3 code tables used by the wall checks, with the source of each table.
 * Temperatures in °F, lengths in inches; all factors dimensionless.
 */
import type { ProductForm } from '../model/spool';
import { interpolate, type TablePoint } from './interpolate';
import type { WFamily, YFamily } from './materials';

const FROM_MEMORY = 'from memory, verify against the licensed edition';

const fmt = (v: number): string => String(Math.round(v * 10_000) / 10_000);

// ---------------------------------------------------------------------------------------------
// Coefficient Y — B31.3 Table 304.1.1
// ---------------------------------------------------------------------------------------------

export const COEFFICIENT_Y_SOURCE =
  'ASME B31.3 Table 304.1.1 (values for t < D/6; straight-line interpolation permitted)';

const pts = (rows: readonly (readonly [number, number])[]): TablePoint[] =>
  rows.map(([x, y]) => ({ x, y }));

/** Table 304.1.1 rows; the first column reads "≤900 °F", the last "≥1250 °F". */
export const COEFFICIENT_Y_TABLE: Readonly<
  Record<'ferritic' | 'austenitic' | 'nickel', readonly TablePoint[]>
> = {
  ferritic: pts([
    [900, 0.4],
    [950, 0.5],
    [1000, 0.7],
    [1050, 0.7],
    [1100, 0.7],
    [1150, 0.7],
    [1200, 0.7],
    [1250, 0.7],
  ]),
  austenitic: pts([
    [900, 0.4],
    [950, 0.4],
    [1000, 0.4],
    [1050, 0.4],
    [1100, 0.5],
    [1150, 0.7],
    [1200, 0.7],
    [1250, 0.7],
  ]),
  /** Ni alloys UNS N06617, N08800, N08810, N08825. */
  nickel: pts([
    [900, 0.4],
    [950, 0.4],
    [1000, 0.4],
    [1050, 0.4],
    [1100, 0.4],
    [1150, 0.4],
    [1200, 0.5],
    [1250, 0.7],
  ]),
};

/**
 * Coefficient Y at tempF (valid for t < D/6; for t ≥ D/6 the engine uses Y = (d + 2c)/(D + d + 2c)).
 * Below 900 °F: 0.4; at and above 1250 °F: 0.7 (the table's "≥1250 °F" column). Gray iron 0.0;
 * other ductile metals 0.4 at all temperatures.
 */
export function coefficientY(family: YFamily, tempF: number): { value: number; source: string } {
  if (family === 'gray-iron') return { value: 0, source: `${COEFFICIENT_Y_SOURCE}, gray iron` };
  if (family === 'other')
    return {
      value: 0.4,
      source: `${COEFFICIENT_Y_SOURCE}, other ductile metals (all temperatures)`,
    };
  const table = COEFFICIENT_Y_TABLE[family];
  const last = table[table.length - 1]!;
  // The last column reads "≥1250 °F", so it holds above 1250 °F (not an extrapolation).
  const r = tempF >= last.x ? { value: last.y } : interpolate(table, tempF);
  const label = family === 'nickel' ? 'Ni alloys N06617/N08800/N08810/N08825' : `${family} steels`;
  if (r === undefined) {
    // Only a non-finite temperature gets here; report the lowest-temperature value.
    return {
      value: table[0]!.y,
      source: `${COEFFICIENT_Y_SOURCE}, ${label} (temperature not a number: ≤900 °F value)`,
    };
  }
  const interpolated = !table.some((p) => p.x === tempF) && tempF > table[0]!.x && tempF < last.x;
  return {
    value: r.value,
    source: `${COEFFICIENT_Y_SOURCE}, ${label}${interpolated ? `, interpolated at ${fmt(tempF)} °F` : ''}`,
  };
}

// ---------------------------------------------------------------------------------------------
// Quality factor E — B31.3 Table A-1B, para. 302.3.4
// ---------------------------------------------------------------------------------------------

export const QUALITY_FACTOR_E_SOURCE =
  'ASME B31.3 Table A-1B, para. 302.3.4 (basic quality factor for longitudinal weld joints)';

/** Basic quality factor E by product form (B31.3 Table A-1B). */
export const QUALITY_FACTOR_E: Readonly<Record<ProductForm, number>> = {
  seamless: 1.0,
  'furnace-butt': 0.6,
  /** Electric resistance welded; additional examination does not raise it. */
  erw: 0.85,
  'efw-single': 0.8,
  'efw-double': 0.85,
  'efw-spot-rt': 0.9,
  'efw-full-rt': 1.0,
};

/** API 5L submerged-arc welded pipe, E = 0.95 (Table A-1B); no ProductForm value exists for it, enter E directly. */
export const QUALITY_FACTOR_E_API5L_SAW = 0.95;

const FORM_LABEL: Readonly<Record<ProductForm, string>> = {
  seamless: 'seamless',
  'furnace-butt': 'furnace butt welded',
  erw: 'electric resistance welded (additional examination does not raise E)',
  'efw-single': 'electric fusion welded, single butt',
  'efw-double': 'electric fusion welded, double butt',
  'efw-spot-rt': 'electric fusion welded, spot radiographed',
  'efw-full-rt': 'electric fusion welded, 100 % radiographed',
};

export function qualityFactorE(form: ProductForm): { value: number; source: string } {
  return {
    value: QUALITY_FACTOR_E[form],
    source: `${QUALITY_FACTOR_E_SOURCE}: ${FORM_LABEL[form]}`,
  };
}

// ---------------------------------------------------------------------------------------------
// Weld joint strength reduction factor W — B31.3 para. 302.3.5, Table 302.3.5
// ---------------------------------------------------------------------------------------------

export const WELD_STRENGTH_FACTOR_W_SOURCE =
  'ASME B31.3-2014/2016 Table 302.3.5 (weld joint strength reduction factor W)';
export const WELD_STRENGTH_FACTOR_W_LEGACY_SOURCE =
  'ASME B31.3 para. 302.3.5, older editions: W = 1.0 at 950 °F falling linearly to 0.5 at 1500 °F';

/** Table 302.3.5 rows as embedded (°F). Below a row's first temperature W = 1.0. */
export const WELD_STRENGTH_FACTOR_W_TABLE: Readonly<
  Record<'cr-mo' | 'austenitic' | 'autogenous-austenitic', readonly TablePoint[]>
> = {
  'cr-mo': pts([
    [800, 1],
    [850, 0.95],
    [900, 0.91],
    [950, 0.86],
    [1000, 0.82],
    [1050, 0.77],
    [1100, 0.73],
    [1150, 0.68],
    [1200, 0.64],
  ]),
  /** Austenitic stainless 3xx and N088xx nickel alloys. */
  austenitic: pts([
    [950, 1],
    [1000, 0.95],
    [1050, 0.91],
    [1100, 0.86],
    [1150, 0.82],
    [1200, 0.77],
    [1250, 0.73],
    [1300, 0.68],
    [1350, 0.64],
    [1400, 0.59],
    [1450, 0.55],
    [1500, 0.5],
  ]),
  /** Autogenous welds in austenitic stainless steel (no ProductForm selects it; enter W = 1 as an override). */
  'autogenous-austenitic': pts([
    [950, 1],
    [1000, 1],
    [1050, 1],
    [1100, 1],
    [1150, 1],
    [1200, 1],
    [1250, 1],
    [1300, 1],
    [1350, 1],
    [1400, 1],
    [1450, 1],
    [1500, 1],
  ]),
};

const LEGACY_POINTS: readonly TablePoint[] = pts([
  [950, 1],
  [1500, 0.5],
]);

function legacyW(tempF: number, why: string): { value: number; source: string; rule: string } {
  const last = LEGACY_POINTS[LEGACY_POINTS.length - 1]!;
  if (tempF > last.x) {
    return {
      value: last.y,
      source: WELD_STRENGTH_FACTOR_W_LEGACY_SOURCE,
      rule: `linear-legacy${why}: ${fmt(tempF)} °F is above 1500 °F, the rule's last temperature; its last value 0.5 is held (the allowable-stress table limits the temperature)`,
    };
  }
  const r = interpolate(LEGACY_POINTS, tempF);
  const value = r?.value ?? 1;
  return {
    value,
    source: WELD_STRENGTH_FACTOR_W_LEGACY_SOURCE,
    rule:
      tempF <= 950
        ? `linear-legacy${why}: 1.0 at or below 950 °F`
        : `linear-legacy${why}: interpolated at ${fmt(tempF)} °F`,
  };
}

/**
 * W for a longitudinal or spiral weld at tempF.
 * - Seamless pipe, and family 'none': 1.0.
 * - rule 'table' (default), Table 302.3.5 (2014/2016) with straight-line interpolation:
 *   cr-mo: CrMo row (800–1200 °F); austenitic and nickel: the "austenitic 3xx, N088xx" row (950–1500 °F).
 *   Below a row's first temperature: 1.0. Above a row's last temperature: the row's last value is held and
 *   `rule` says so (the material's allowable-stress table bounds the temperature; no extrapolation).
 *   carbon and csef: no row of the table is embedded for these families. Below 800 °F (the lowest tabulated
 *   temperature of the embedded table) W = 1.0; at 800 °F and above the older-edition linear rule is
 *   applied and `rule` says the row is missing, so the user can verify and override W.
 * - rule 'linear-legacy': 1.0 at or below 950 °F, linearly to 0.5 at 1500 °F (0.5 held above).
 */
export function weldStrengthFactorW(
  family: WFamily,
  form: ProductForm,
  tempF: number,
  rule: 'table' | 'linear-legacy' = 'table',
): { value: number; source: string; rule: string } {
  if (form === 'seamless') {
    return {
      value: 1,
      source: `${WELD_STRENGTH_FACTOR_W_SOURCE}: seamless pipe`,
      rule: 'seamless: W = 1.0 (no longitudinal weld)',
    };
  }
  if (family === 'none') {
    return {
      value: 1,
      source: `${WELD_STRENGTH_FACTOR_W_SOURCE}: no reduction family`,
      rule: 'none: W = 1.0 (material outside the table families)',
    };
  }
  if (rule === 'linear-legacy') return legacyW(tempF, '');
  if (family === 'carbon' || family === 'csef') {
    if (tempF < 800) {
      return {
        value: 1,
        source: `${WELD_STRENGTH_FACTOR_W_SOURCE}: below the tabulated temperatures`,
        rule: `table: ${fmt(tempF)} °F is below 800 °F, the table's lowest temperature: W = 1.0`,
      };
    }
    const label = family === 'carbon' ? 'carbon-steel' : 'CSEF';
    return legacyW(
      tempF,
      ` (the ${label} row of Table 302.3.5 is not embedded; verify W against the edition in force or enter it)`,
    );
  }
  const key = family === 'cr-mo' ? 'cr-mo' : 'austenitic';
  const row = WELD_STRENGTH_FACTOR_W_TABLE[key];
  const first = row[0]!;
  const last = row[row.length - 1]!;
  const rowLabel = key === 'cr-mo' ? 'CrMo row' : 'austenitic 3xx / N088xx row';
  const note =
    family === 'nickel' ? ' (the row covers N088xx alloys; verify for other nickel alloys)' : '';
  const source = `${WELD_STRENGTH_FACTOR_W_SOURCE}, ${rowLabel}${note}`;
  if (tempF < first.x) {
    return {
      value: 1,
      source,
      rule: `table: ${fmt(tempF)} °F is below ${first.x} °F, the row's first temperature: W = 1.0`,
    };
  }
  if (tempF > last.x) {
    return {
      value: last.y,
      source,
      rule: `table: ${fmt(tempF)} °F is above ${last.x} °F, the row's last temperature; its last value ${last.y} is held (the allowable-stress table limits the temperature)`,
    };
  }
  const r = interpolate(row, tempF);
  const exact = row.some((p) => p.x === tempF);
  return {
    value: r?.value ?? 1,
    source,
    rule: exact ? `table: ${fmt(tempF)} °F tabulated` : `table: interpolated at ${fmt(tempF)} °F`,
  };
}

// ---------------------------------------------------------------------------------------------
// Thread and groove depth
// ---------------------------------------------------------------------------------------------

export const THREAD_DEPTH_SOURCE = 'ASME B1.20.1 NPT thread height h = 0.8p';

/** ASME B1.20.1 threads per inch and thread height by NPS band (largest NPS of the band, in). */
export const THREAD_TABLE: readonly {
  readonly maxNps: number;
  readonly label: string;
  readonly threadsPerInch: number;
  readonly inches: number;
}[] = [
  { maxNps: 0.125, label: 'NPS 1/16–1/8', threadsPerInch: 27, inches: 0.02963 },
  { maxNps: 0.375, label: 'NPS 1/4–3/8', threadsPerInch: 18, inches: 0.04444 },
  { maxNps: 0.75, label: 'NPS 1/2–3/4', threadsPerInch: 14, inches: 0.05714 },
  { maxNps: 2, label: 'NPS 1–2', threadsPerInch: 11.5, inches: 0.06957 },
  { maxNps: Infinity, label: 'NPS 2-1/2 and larger', threadsPerInch: 8, inches: 0.1 },
];

/**
 * NPT thread depth for an NPS given as a number (1.5 for NPS 1-1/2). Sizes between the listed bands fall
 * to the next band up. Throws RangeError for a non-positive or non-finite NPS (the document schema
 * already rejects those).
 */
export function threadDepth(npsValue: number): {
  inches: number;
  threadsPerInch: number;
  source: string;
} {
  if (!Number.isFinite(npsValue) || npsValue <= 0)
    throw new RangeError(`NPS must be a positive number, got ${npsValue}`);
  const band =
    THREAD_TABLE.find((b) => npsValue <= b.maxNps + 1e-9) ?? THREAD_TABLE[THREAD_TABLE.length - 1]!;
  return {
    inches: band.inches,
    threadsPerInch: band.threadsPerInch,
    source: `${THREAD_DEPTH_SOURCE}: ${band.label}, ${band.threadsPerInch} threads/in`,
  };
}

/** Allowance added to a groove depth where no tolerance is stated: 0.5 mm ≈ 0.02 in (from memory). */
export const GROOVE_TOLERANCE_IN = 0.02;
export const GROOVE_TOLERANCE_SOURCE = `groove depth + 0.5 mm (0.02 in) where no tolerance is stated; ${FROM_MEMORY}`;
export const GROOVE_TOLERANCE_FROM_MEMORY = true;

// ---------------------------------------------------------------------------------------------
// Bends: thickness before bending
// ---------------------------------------------------------------------------------------------

export const PRE_BEND_SOURCE =
  'ASME B31.1 Table 102.4.5 (recommended minimum thickness before bending; reproduced in UFC 3-430 series tables), straight-line interpolation';

/** B31.1 Table 102.4.5: bend radius as a multiple of nominal pipe size → factor on tm. "6D or greater": 1.06. */
export const PRE_BEND_TABLE: readonly TablePoint[] = pts([
  [3, 1.25],
  [4, 1.14],
  [5, 1.08],
  [6, 1.06],
]);

/**
 * Ratios within this relative distance of a tabulated radius are that radius: R1/NPS computed in
 * millimetres (3 × 203.2 / 203.2 = 2.9999999999999996) must read the 3D row, not fall off the table.
 */
export const PRE_BEND_RATIO_TOLERANCE = 1e-9;

export function preBendFactor(radiusOverNps: number): {
  value: number | null;
  source: string;
  note: string;
} {
  const first = PRE_BEND_TABLE[0]!;
  const last = PRE_BEND_TABLE[PRE_BEND_TABLE.length - 1]!;
  if (!Number.isFinite(radiusOverNps))
    return { value: null, source: PRE_BEND_SOURCE, note: 'bend radius ratio is not a number' };
  // Snap to a tabulated radius within the tolerance (unit round-off is not a different bend).
  let x = radiusOverNps;
  for (const p of PRE_BEND_TABLE) if (Math.abs(x - p.x) <= PRE_BEND_RATIO_TOLERANCE * p.x) x = p.x;
  if (x < first.x) {
    return {
      value: null,
      source: PRE_BEND_SOURCE,
      note: `below table range: R/NPS ${fmt(radiusOverNps)} is under 3D, the table's tightest radius`,
    };
  }
  if (x >= last.x) return { value: last.y, source: PRE_BEND_SOURCE, note: '6D or greater' };
  const r = interpolate(PRE_BEND_TABLE, x)!;
  const exact = PRE_BEND_TABLE.some((p) => p.x === x);
  return {
    value: r.value,
    source: PRE_BEND_SOURCE,
    note: exact ? `${fmt(x)}D tabulated` : `interpolated at ${fmt(radiusOverNps)}D`,
  };
}

/** Numbers-only form of `preBendFactor` (no strings, no objects): the factor, or null below 3D. */
export function preBendFactorValue(radiusOverNps: number): number | null {
  if (!Number.isFinite(radiusOverNps)) return null;
  const table = PRE_BEND_TABLE;
  let x = radiusOverNps;
  for (let i = 0; i < table.length; i++) {
    const p = table[i]!;
    if (Math.abs(x - p.x) <= PRE_BEND_RATIO_TOLERANCE * p.x) x = p.x;
  }
  if (x < table[0]!.x) return null;
  const last = table[table.length - 1]!;
  if (x >= last.x) return last.y;
  for (let i = 1; i < table.length; i++) {
    const hi = table[i]!;
    if (x > hi.x) continue;
    if (x === hi.x) return hi.y;
    const lo = table[i - 1]!;
    // Same arithmetic as interpolate(), so both forms give the same number.
    return lo.y + (hi.y - lo.y) * ((x - lo.x) / (hi.x - lo.x));
  }
  return null;
}

export const GEOMETRIC_THINNING_SOURCE =
  'common practice: geometric estimate with the neutral axis at the centreline, t_ext ≈ t·(2R/D)/(2R/D + 1), t_int ≈ t·(2R/D)/(2R/D − 1)';

/**
 * Wall-thickness factors after bending (multiply the wall before bending). radiusOverD = R/D.
 * Throws RangeError for R/D ≤ 0.5 or non-finite input (the intrados estimate is undefined there;
 * the engine rejects such bends first).
 */
export function geometricThinning(radiusOverD: number): {
  extrados: number;
  intrados: number;
  source: string;
} {
  if (!Number.isFinite(radiusOverD) || radiusOverD <= 0.5) {
    throw new RangeError(`bend R/D must exceed 0.5, got ${radiusOverD}`);
  }
  const k = 2 * radiusOverD;
  return { extrados: k / (k + 1), intrados: k / (k - 1), source: GEOMETRIC_THINNING_SOURCE };
}

// ---------------------------------------------------------------------------------------------
// Mill under-tolerance
// ---------------------------------------------------------------------------------------------

/** Wall may be 12.5 % under nominal; check T·(1 − 0.125) ≥ tm (never tm × 1.125). */
export const MILL_TOLERANCE_DEFAULT = 0.125;
export const MILL_TOLERANCE_SOURCE =
  'ASTM A530/A530M and A999/A999M (as applied by A106, A53, A312): wall up to 12.5 % under nominal';
/** Plate-formed pipe: fixed under-tolerance of 0.01 in (0.3 mm). */
export const PLATE_UNDER_TOLERANCE_IN = 0.01;
export const PLATE_UNDER_TOLERANCE_SOURCE =
  'ASTM A358: plate-formed pipe, fixed under-tolerance 0.01 in (0.3 mm)';
