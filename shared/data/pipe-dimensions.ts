/**
 * Pipe outside diameters and wall thicknesses for carbon/alloy steel pipe (ASME B36.10M)
 * and stainless steel pipe (ASME B36.19M, the "S" schedules).
 *
 * Values are stored as the standards print them: inches, plus the standard's own metric
 * column. The metric OD is not always in × 25.4: the standards round it (NPS 18 is 457 mm,
 * not 457.2), and the two standards round NPS 10 and 12 differently (B36.10M 273.0/323.8 mm,
 * B36.19M 273.1/323.9 mm). Metric walls are in × 25.4 rounded to 0.01 mm except where the
 * standard prints otherwise (NPS 1-1/2 XXS: 0.400 in is printed as 10.15 mm).
 *
 * The tables were written from memory of the published standards and are proven by a test
 * that compares every entry with an independent open-source tabulation of both standards.
 */

export type PipeStandard = 'B36.10M' | 'B36.19M';

export interface PipeSizeInfo {
  /** Canonical nominal pipe size, e.g. "1-1/2". */
  nps: string;
  /** NPS as a number, e.g. 1.5. */
  npsValue: number;
  /** Metric designation DN (ISO 6708), e.g. 40 for NPS 1-1/2. */
  dn: number;
  /** Outside diameter, in, as published. */
  odIn: number;
  /** Outside diameter, mm, as published in the standard's metric column. */
  odMm: number;
}

export interface PipeWall {
  /** Canonical nominal pipe size. */
  nps: string;
  /** Canonical schedule designation, e.g. "40", "STD", "10S". */
  schedule: string;
  standard: PipeStandard;
  /** Outside diameter, in. */
  odIn: number;
  /** Outside diameter, mm, per the standard's metric column. */
  odMm: number;
  /** Nominal wall thickness, in. */
  wallIn: number;
  /** Nominal wall thickness, mm, per the standard's metric column. */
  wallMm: number;
  /** Where the numbers come from (standard, table, edition). */
  source: string;
}

/** Source strings carried by every wall and size looked up from these tables. */
export const PIPE_DIMENSION_SOURCES: Readonly<Record<PipeStandard, string>> = {
  'B36.10M':
    'ASME B36.10M Table 1 (2004 edition as best known; values from memory, cross-checked against an independent open-source tabulation of ASME B36.10M-2004)',
  'B36.19M':
    'ASME B36.19M Table 1 (2004 edition as best known; values from memory, cross-checked against an independent open-source tabulation of ASME B36.19M-2004)',
};

/** Canonical NPS strings in ascending order. */
// prettier-ignore
export const NPS_SIZES: readonly string[] = [
  '1/8', '1/4', '3/8', '1/2', '3/4', '1', '1-1/4', '1-1/2', '2', '2-1/2', '3', '3-1/2', '4',
  '5', '6', '8', '10', '12', '14', '16', '18', '20', '22', '24', '26', '28', '30', '32', '34',
  '36', '38', '40', '42', '44', '46', '48',
];

/** B36.10M schedules, then B36.19M schedules; this order also breaks wall ties. */
const NUMBERED_SCHEDULES = ['10', '20', '30', '40', '60', '80', '100', '120', '140', '160'];
const WEIGHT_SCHEDULES = ['STD', 'XS', 'XXS'];
const STAINLESS_SCHEDULES = ['5S', '10S', '40S', '80S'];

/** All schedule designations the tables use. */
export const SCHEDULES: readonly string[] = [
  ...NUMBERED_SCHEDULES,
  ...WEIGHT_SCHEDULES,
  ...STAINLESS_SCHEDULES,
];

/** [nps, npsValue, dn, odIn, odMm] */
type SizeRow = readonly [string, number, number, number, number];
/** [nps, wallIn, wallMm] */
type WallRow = readonly [string, number, number];

// ASME B36.10M Table 1: outside diameters. NPS 10 and 12 metric ODs are the B36.10M values.
const B36_10M_SIZES: readonly SizeRow[] = [
  ['1/8', 0.125, 6, 0.405, 10.3],
  ['1/4', 0.25, 8, 0.54, 13.7],
  ['3/8', 0.375, 10, 0.675, 17.1],
  ['1/2', 0.5, 15, 0.84, 21.3],
  ['3/4', 0.75, 20, 1.05, 26.7],
  ['1', 1, 25, 1.315, 33.4],
  ['1-1/4', 1.25, 32, 1.66, 42.2],
  ['1-1/2', 1.5, 40, 1.9, 48.3],
  ['2', 2, 50, 2.375, 60.3],
  ['2-1/2', 2.5, 65, 2.875, 73.0],
  ['3', 3, 80, 3.5, 88.9],
  ['3-1/2', 3.5, 90, 4.0, 101.6],
  ['4', 4, 100, 4.5, 114.3],
  ['5', 5, 125, 5.563, 141.3],
  ['6', 6, 150, 6.625, 168.3],
  ['8', 8, 200, 8.625, 219.1],
  ['10', 10, 250, 10.75, 273.0],
  ['12', 12, 300, 12.75, 323.8],
  ['14', 14, 350, 14, 355.6],
  ['16', 16, 400, 16, 406.4],
  ['18', 18, 450, 18, 457],
  ['20', 20, 500, 20, 508],
  ['22', 22, 550, 22, 559],
  ['24', 24, 600, 24, 610],
  ['26', 26, 650, 26, 660],
  ['28', 28, 700, 28, 711],
  ['30', 30, 750, 30, 762],
  ['32', 32, 800, 32, 813],
  ['34', 34, 850, 34, 864],
  ['36', 36, 900, 36, 914],
  ['38', 38, 950, 38, 965],
  ['40', 40, 1000, 40, 1016],
  ['42', 42, 1050, 42, 1067],
  ['44', 44, 1100, 44, 1118],
  ['46', 46, 1150, 46, 1168],
  ['48', 48, 1200, 48, 1219],
];

// ASME B36.19M Table 1 covers NPS 1/8 through 24 and NPS 30; its metric ODs for NPS 10 and
// 12 are 273.1 and 323.9 mm, the only ones that differ from B36.10M.
const B36_19M_ODMM_OVERRIDES: Readonly<Record<string, number>> = { '10': 273.1, '12': 323.9 };
// prettier-ignore
const B36_19M_NPS: readonly string[] = [
  '1/8', '1/4', '3/8', '1/2', '3/4', '1', '1-1/4', '1-1/2', '2', '2-1/2', '3', '3-1/2', '4',
  '5', '6', '8', '10', '12', '14', '16', '18', '20', '22', '24', '30',
];

// Walls: ASME B36.10M Table 1. STD equals Sch 40 through NPS 10 and is 0.375 in above;
// XS equals Sch 80 through NPS 8 and is 0.500 in above.
// prettier-ignore
const B36_10M_WALLS: Readonly<Record<string, readonly WallRow[]>> = {
  '10': [
    ['1/8', 0.049, 1.24], ['1/4', 0.065, 1.65], ['3/8', 0.065, 1.65], ['1/2', 0.083, 2.11],
    ['3/4', 0.083, 2.11], ['1', 0.109, 2.77], ['1-1/4', 0.109, 2.77], ['1-1/2', 0.109, 2.77],
    ['2', 0.109, 2.77], ['2-1/2', 0.120, 3.05], ['3', 0.120, 3.05], ['3-1/2', 0.120, 3.05],
    ['4', 0.120, 3.05], ['5', 0.134, 3.40], ['6', 0.134, 3.40], ['8', 0.148, 3.76],
    ['10', 0.165, 4.19], ['12', 0.180, 4.57], ['14', 0.250, 6.35], ['16', 0.250, 6.35],
    ['18', 0.250, 6.35], ['20', 0.250, 6.35], ['22', 0.250, 6.35], ['24', 0.250, 6.35],
    ['26', 0.312, 7.92], ['28', 0.312, 7.92], ['30', 0.312, 7.92], ['32', 0.312, 7.92],
    ['34', 0.312, 7.92], ['36', 0.312, 7.92],
  ],
  '20': [
    ['8', 0.250, 6.35], ['10', 0.250, 6.35], ['12', 0.250, 6.35], ['14', 0.312, 7.92],
    ['16', 0.312, 7.92], ['18', 0.312, 7.92], ['20', 0.375, 9.53], ['22', 0.375, 9.53],
    ['24', 0.375, 9.53], ['26', 0.500, 12.70], ['28', 0.500, 12.70], ['30', 0.500, 12.70],
    ['32', 0.500, 12.70], ['34', 0.500, 12.70], ['36', 0.500, 12.70],
  ],
  '30': [
    ['1/8', 0.057, 1.45], ['1/4', 0.073, 1.85], ['3/8', 0.073, 1.85], ['1/2', 0.095, 2.41],
    ['3/4', 0.095, 2.41], ['1', 0.114, 2.90], ['1-1/4', 0.117, 2.97], ['1-1/2', 0.125, 3.18],
    ['2', 0.125, 3.18], ['2-1/2', 0.188, 4.78], ['3', 0.188, 4.78], ['3-1/2', 0.188, 4.78],
    ['4', 0.188, 4.78], ['8', 0.277, 7.04], ['10', 0.307, 7.80], ['12', 0.330, 8.38],
    ['14', 0.375, 9.53], ['16', 0.375, 9.53], ['18', 0.438, 11.13], ['20', 0.500, 12.70],
    ['22', 0.500, 12.70], ['24', 0.562, 14.27], ['28', 0.625, 15.88], ['30', 0.625, 15.88],
    ['32', 0.625, 15.88], ['34', 0.625, 15.88], ['36', 0.625, 15.88],
  ],
  '40': [
    ['1/8', 0.068, 1.73], ['1/4', 0.088, 2.24], ['3/8', 0.091, 2.31], ['1/2', 0.109, 2.77],
    ['3/4', 0.113, 2.87], ['1', 0.133, 3.38], ['1-1/4', 0.140, 3.56], ['1-1/2', 0.145, 3.68],
    ['2', 0.154, 3.91], ['2-1/2', 0.203, 5.16], ['3', 0.216, 5.49], ['3-1/2', 0.226, 5.74],
    ['4', 0.237, 6.02], ['5', 0.258, 6.55], ['6', 0.280, 7.11], ['8', 0.322, 8.18],
    ['10', 0.365, 9.27], ['12', 0.406, 10.31], ['14', 0.438, 11.13], ['16', 0.500, 12.70],
    ['18', 0.562, 14.27], ['20', 0.594, 15.09], ['24', 0.688, 17.48], ['32', 0.688, 17.48],
    ['34', 0.688, 17.48], ['36', 0.750, 19.05],
  ],
  '60': [
    ['8', 0.406, 10.31], ['10', 0.500, 12.70], ['12', 0.562, 14.27], ['14', 0.594, 15.09],
    ['16', 0.656, 16.66], ['18', 0.750, 19.05], ['20', 0.812, 20.62], ['22', 0.875, 22.23],
    ['24', 0.969, 24.61],
  ],
  '80': [
    ['1/8', 0.095, 2.41], ['1/4', 0.119, 3.02], ['3/8', 0.126, 3.20], ['1/2', 0.147, 3.73],
    ['3/4', 0.154, 3.91], ['1', 0.179, 4.55], ['1-1/4', 0.191, 4.85], ['1-1/2', 0.200, 5.08],
    ['2', 0.218, 5.54], ['2-1/2', 0.276, 7.01], ['3', 0.300, 7.62], ['3-1/2', 0.318, 8.08],
    ['4', 0.337, 8.56], ['5', 0.375, 9.53], ['6', 0.432, 10.97], ['8', 0.500, 12.70],
    ['10', 0.594, 15.09], ['12', 0.688, 17.48], ['14', 0.750, 19.05], ['16', 0.844, 21.44],
    ['18', 0.938, 23.83], ['20', 1.031, 26.19], ['22', 1.125, 28.58], ['24', 1.219, 30.96],
  ],
  '100': [
    ['8', 0.594, 15.09], ['10', 0.719, 18.26], ['12', 0.844, 21.44], ['14', 0.938, 23.83],
    ['16', 1.031, 26.19], ['18', 1.156, 29.36], ['20', 1.281, 32.54], ['22', 1.375, 34.93],
    ['24', 1.531, 38.89],
  ],
  '120': [
    ['4', 0.438, 11.13], ['5', 0.500, 12.70], ['6', 0.562, 14.27], ['8', 0.719, 18.26],
    ['10', 0.844, 21.44], ['12', 1.000, 25.40], ['14', 1.094, 27.79], ['16', 1.219, 30.96],
    ['18', 1.375, 34.93], ['20', 1.500, 38.10], ['22', 1.625, 41.28], ['24', 1.812, 46.02],
  ],
  '140': [
    ['8', 0.812, 20.62], ['10', 1.000, 25.40], ['12', 1.125, 28.58], ['14', 1.250, 31.75],
    ['16', 1.438, 36.53], ['18', 1.562, 39.67], ['20', 1.750, 44.45], ['22', 1.875, 47.63],
    ['24', 2.062, 52.37],
  ],
  '160': [
    ['1/2', 0.188, 4.78], ['3/4', 0.219, 5.56], ['1', 0.250, 6.35], ['1-1/4', 0.250, 6.35],
    ['1-1/2', 0.281, 7.14], ['2', 0.344, 8.74], ['2-1/2', 0.375, 9.53], ['3', 0.438, 11.13],
    ['4', 0.531, 13.49], ['5', 0.625, 15.88], ['6', 0.719, 18.26], ['8', 0.906, 23.01],
    ['10', 1.125, 28.58], ['12', 1.312, 33.32], ['14', 1.406, 35.71], ['16', 1.594, 40.49],
    ['18', 1.781, 45.24], ['20', 1.969, 50.01], ['22', 2.125, 53.98], ['24', 2.344, 59.54],
  ],
  'XXS': [
    ['1/2', 0.294, 7.47], ['3/4', 0.308, 7.82], ['1', 0.358, 9.09], ['1-1/4', 0.382, 9.70],
    ['1-1/2', 0.400, 10.15], ['2', 0.436, 11.07], ['2-1/2', 0.552, 14.02], ['3', 0.600, 15.24],
    ['4', 0.674, 17.12], ['5', 0.750, 19.05], ['6', 0.864, 21.95], ['8', 0.875, 22.23],
    ['10', 1.000, 25.40], ['12', 1.000, 25.40],
  ],
  'STD': [
    ['1/8', 0.068, 1.73], ['1/4', 0.088, 2.24], ['3/8', 0.091, 2.31], ['1/2', 0.109, 2.77],
    ['3/4', 0.113, 2.87], ['1', 0.133, 3.38], ['1-1/4', 0.140, 3.56], ['1-1/2', 0.145, 3.68],
    ['2', 0.154, 3.91], ['2-1/2', 0.203, 5.16], ['3', 0.216, 5.49], ['3-1/2', 0.226, 5.74],
    ['4', 0.237, 6.02], ['5', 0.258, 6.55], ['6', 0.280, 7.11], ['8', 0.322, 8.18],
    ['10', 0.365, 9.27], ['12', 0.375, 9.53], ['14', 0.375, 9.53], ['16', 0.375, 9.53],
    ['18', 0.375, 9.53], ['20', 0.375, 9.53], ['22', 0.375, 9.53], ['24', 0.375, 9.53],
    ['26', 0.375, 9.53], ['28', 0.375, 9.53], ['30', 0.375, 9.53], ['32', 0.375, 9.53],
    ['34', 0.375, 9.53], ['36', 0.375, 9.53], ['38', 0.375, 9.53], ['40', 0.375, 9.53],
    ['42', 0.375, 9.53], ['44', 0.375, 9.53], ['46', 0.375, 9.53], ['48', 0.375, 9.53],
  ],
  'XS': [
    ['1/8', 0.095, 2.41], ['1/4', 0.119, 3.02], ['3/8', 0.126, 3.20], ['1/2', 0.147, 3.73],
    ['3/4', 0.154, 3.91], ['1', 0.179, 4.55], ['1-1/4', 0.191, 4.85], ['1-1/2', 0.200, 5.08],
    ['2', 0.218, 5.54], ['2-1/2', 0.276, 7.01], ['3', 0.300, 7.62], ['3-1/2', 0.318, 8.08],
    ['4', 0.337, 8.56], ['5', 0.375, 9.53], ['6', 0.432, 10.97], ['8', 0.500, 12.70],
    ['10', 0.500, 12.70], ['12', 0.500, 12.70], ['14', 0.500, 12.70], ['16', 0.500, 12.70],
    ['18', 0.500, 12.70], ['20', 0.500, 12.70], ['22', 0.500, 12.70], ['24', 0.500, 12.70],
    ['26', 0.500, 12.70], ['28', 0.500, 12.70], ['30', 0.500, 12.70], ['32', 0.500, 12.70],
    ['34', 0.500, 12.70], ['36', 0.500, 12.70], ['38', 0.500, 12.70], ['40', 0.500, 12.70],
    ['42', 0.500, 12.70], ['44', 0.500, 12.70], ['46', 0.500, 12.70], ['48', 0.500, 12.70],
  ],
};

// Walls: ASME B36.19M Table 1. 40S equals STD and 80S equals XS wherever B36.19M lists them
// (so NPS 12 40S is 0.375 in, not the Sch 40 0.406 in); none are listed for NPS 22 or 30.
// prettier-ignore
const B36_19M_WALLS: Readonly<Record<string, readonly WallRow[]>> = {
  '5S': [
    ['1/2', 0.065, 1.65], ['3/4', 0.065, 1.65], ['1', 0.065, 1.65], ['1-1/4', 0.065, 1.65],
    ['1-1/2', 0.065, 1.65], ['2', 0.065, 1.65], ['2-1/2', 0.083, 2.11], ['3', 0.083, 2.11],
    ['3-1/2', 0.083, 2.11], ['4', 0.083, 2.11], ['5', 0.109, 2.77], ['6', 0.109, 2.77],
    ['8', 0.109, 2.77], ['10', 0.134, 3.40], ['12', 0.156, 3.96], ['14', 0.156, 3.96],
    ['16', 0.165, 4.19], ['18', 0.165, 4.19], ['20', 0.188, 4.78], ['22', 0.188, 4.78],
    ['24', 0.218, 5.54], ['30', 0.250, 6.35],
  ],
  '10S': [
    ['1/8', 0.049, 1.24], ['1/4', 0.065, 1.65], ['3/8', 0.065, 1.65], ['1/2', 0.083, 2.11],
    ['3/4', 0.083, 2.11], ['1', 0.109, 2.77], ['1-1/4', 0.109, 2.77], ['1-1/2', 0.109, 2.77],
    ['2', 0.109, 2.77], ['2-1/2', 0.120, 3.05], ['3', 0.120, 3.05], ['3-1/2', 0.120, 3.05],
    ['4', 0.120, 3.05], ['5', 0.134, 3.40], ['6', 0.134, 3.40], ['8', 0.148, 3.76],
    ['10', 0.165, 4.19], ['12', 0.180, 4.57], ['14', 0.188, 4.78], ['16', 0.188, 4.78],
    ['18', 0.188, 4.78], ['20', 0.218, 5.54], ['22', 0.218, 5.54], ['24', 0.250, 6.35],
    ['30', 0.312, 7.92],
  ],
  '40S': [
    ['1/8', 0.068, 1.73], ['1/4', 0.088, 2.24], ['3/8', 0.091, 2.31], ['1/2', 0.109, 2.77],
    ['3/4', 0.113, 2.87], ['1', 0.133, 3.38], ['1-1/4', 0.140, 3.56], ['1-1/2', 0.145, 3.68],
    ['2', 0.154, 3.91], ['2-1/2', 0.203, 5.16], ['3', 0.216, 5.49], ['3-1/2', 0.226, 5.74],
    ['4', 0.237, 6.02], ['5', 0.258, 6.55], ['6', 0.280, 7.11], ['8', 0.322, 8.18],
    ['10', 0.365, 9.27], ['12', 0.375, 9.53], ['14', 0.375, 9.53], ['16', 0.375, 9.53],
    ['18', 0.375, 9.53], ['20', 0.375, 9.53], ['24', 0.375, 9.53],
  ],
  '80S': [
    ['1/8', 0.095, 2.41], ['1/4', 0.119, 3.02], ['3/8', 0.126, 3.20], ['1/2', 0.147, 3.73],
    ['3/4', 0.154, 3.91], ['1', 0.179, 4.55], ['1-1/4', 0.191, 4.85], ['1-1/2', 0.200, 5.08],
    ['2', 0.218, 5.54], ['2-1/2', 0.276, 7.01], ['3', 0.300, 7.62], ['3-1/2', 0.318, 8.08],
    ['4', 0.337, 8.56], ['5', 0.375, 9.53], ['6', 0.432, 10.97], ['8', 0.500, 12.70],
    ['10', 0.500, 12.70], ['12', 0.500, 12.70], ['14', 0.500, 12.70], ['16', 0.500, 12.70],
    ['18', 0.500, 12.70], ['20', 0.500, 12.70], ['24', 0.500, 12.70],
  ],
};

// ---------------------------------------------------------------------------------------
// Indexes, built once at module load (pure data; no state changes afterwards).

const key = (nps: string, schedule: string): string => `${nps}|${schedule}`;

function buildSizes(standard: PipeStandard): Map<string, PipeSizeInfo> {
  const listed = standard === 'B36.10M' ? null : new Set(B36_19M_NPS);
  const map = new Map<string, PipeSizeInfo>();
  for (const [nps, npsValue, dn, odIn, odMm] of B36_10M_SIZES) {
    if (listed && !listed.has(nps)) continue;
    const mm = standard === 'B36.19M' ? (B36_19M_ODMM_OVERRIDES[nps] ?? odMm) : odMm;
    map.set(nps, Object.freeze({ nps, npsValue, dn, odIn, odMm: mm }));
  }
  return map;
}

const SIZES: Readonly<Record<PipeStandard, Map<string, PipeSizeInfo>>> = {
  'B36.10M': buildSizes('B36.10M'),
  'B36.19M': buildSizes('B36.19M'),
};

function buildWalls(): Map<string, PipeWall> {
  const map = new Map<string, PipeWall>();
  const add = (standard: PipeStandard, tables: Readonly<Record<string, readonly WallRow[]>>) => {
    for (const [schedule, rows] of Object.entries(tables)) {
      for (const [nps, wallIn, wallMm] of rows) {
        const size = SIZES[standard].get(nps);
        if (!size) throw new Error(`pipe-dimensions: ${standard} lists no OD for NPS ${nps}`);
        map.set(
          key(nps, schedule),
          Object.freeze({
            nps,
            schedule,
            standard,
            odIn: size.odIn,
            odMm: size.odMm,
            wallIn,
            wallMm,
            source: PIPE_DIMENSION_SOURCES[standard],
          }),
        );
      }
    }
  };
  add('B36.10M', B36_10M_WALLS);
  add('B36.19M', B36_19M_WALLS);
  return map;
}

const WALLS = buildWalls();
const SCHEDULE_RANK = new Map(SCHEDULES.map((s, i) => [s, i]));

function buildWallLists(): Map<string, readonly PipeWall[]> {
  const lists = new Map<string, PipeWall[]>();
  for (const wall of WALLS.values()) {
    const list = lists.get(wall.nps) ?? [];
    list.push(wall);
    lists.set(wall.nps, list);
  }
  for (const list of lists.values()) {
    list.sort(
      (a, b) =>
        a.wallIn - b.wallIn ||
        (SCHEDULE_RANK.get(a.schedule) ?? 0) - (SCHEDULE_RANK.get(b.schedule) ?? 0),
    );
  }
  return lists;
}

const WALL_LISTS = buildWallLists();

const NPS_BY_VALUE = new Map<number, string>(B36_10M_SIZES.map((r) => [r[1], r[0]]));
const NPS_VALUE = new Map<string, number>(B36_10M_SIZES.map((r) => [r[0], r[1]]));

// ---------------------------------------------------------------------------------------
// Normalisation

const UNICODE_FRACTIONS: Readonly<Record<string, string>> = {
  '⅛': '1/8',
  '¼': '1/4',
  '⅜': '3/8',
  '½': '1/2',
  '¾': '3/4',
};

/** Parses "1-1/2", "1 1/2", "1.5", "3/4", "2" into a number; NaN when it is not one of those. */
function parseNpsNumber(text: string): number {
  const s = text.trim();
  let m = /^(\d+(?:\.\d+)?|\.\d+)$/.exec(s);
  if (m) return Number(m[1]);
  m = /^(\d+)\/(\d+)$/.exec(s);
  if (m) return Number(m[1]) / Number(m[2]);
  m = /^(\d+)(?:\s*-\s*|\s+)(\d+)\/(\d+)$/.exec(s);
  if (m) return Number(m[1]) + Number(m[2]) / Number(m[3]);
  return Number.NaN;
}

/**
 * "1-1/2" | "1 1/2" | "1.5" | 1.5 | "NPS 2" | '2"' → "1-1/2" / "2"; undefined when the input
 * is not a listed NPS.
 */
export function normalizeNps(input: string | number): string | undefined {
  let value: number;
  if (typeof input === 'number') {
    value = input;
  } else {
    let s = input.trim();
    for (const [glyph, frac] of Object.entries(UNICODE_FRACTIONS)) {
      // "1½" → "1 1/2", "½" → " 1/2"
      s = s.replace(glyph, ` ${frac}`);
    }
    s = s
      .replace(/^nps\s*[:.]?\s*/i, '')
      .replace(/\s*(?:"|''|″|in\.?|inch(?:es)?)$/i, '')
      .trim();
    value = parseNpsNumber(s);
  }
  if (!Number.isFinite(value)) return undefined;
  const exact = NPS_BY_VALUE.get(value);
  if (exact !== undefined) return exact;
  // Tolerate decimal renderings such as 0.375 typed as 0.3750000001.
  for (const [v, nps] of NPS_BY_VALUE) if (Math.abs(v - value) < 1e-9) return nps;
  return undefined;
}

const SCHEDULE_WORDS: Readonly<Record<string, string>> = {
  STANDARD: 'STD',
  STANDARDWEIGHT: 'STD',
  EXTRASTRONG: 'XS',
  XSTRONG: 'XS',
  XH: 'XS',
  DOUBLEEXTRASTRONG: 'XXS',
  XXSTRONG: 'XXS',
  XXH: 'XXS',
};
const SCHEDULE_SET = new Set(SCHEDULES);

/**
 * "40" | "Sch 40" | "sch40" | "std" | "10s" | 40 → "40" | "STD" | "10S"; undefined when the
 * schedule is not one the tables carry.
 */
export function normalizeSchedule(input: string | number): string | undefined {
  const raw = typeof input === 'number' ? String(input) : input;
  const s = raw
    .toUpperCase()
    .replace(/[\s.\-_]/g, '')
    .replace(/^(?:SCHEDULE|SCHED|SCH)/, '');
  const canonical = SCHEDULE_WORDS[s] ?? s;
  return SCHEDULE_SET.has(canonical) ? canonical : undefined;
}

// ---------------------------------------------------------------------------------------
// Lookups

const canonicalNps = (nps: string): string | undefined =>
  NPS_VALUE.has(nps) ? nps : normalizeNps(nps);
const canonicalSchedule = (schedule: string): string | undefined =>
  SCHEDULE_SET.has(schedule) ? schedule : normalizeSchedule(schedule);

/** OD and DN for an NPS under one standard (default B36.10M); undefined when not listed. */
export function getPipeSize(
  nps: string,
  standard: PipeStandard = 'B36.10M',
): PipeSizeInfo | undefined {
  const n = canonicalNps(nps);
  return n === undefined ? undefined : SIZES[standard].get(n);
}

/**
 * Wall for a canonical NPS + schedule. S schedules come from B36.19M, others from B36.10M.
 * undefined when the standard does not list the combination.
 */
export function getPipeWall(nps: string, schedule: string): PipeWall | undefined {
  const n = canonicalNps(nps);
  const s = canonicalSchedule(schedule);
  return n === undefined || s === undefined ? undefined : WALLS_BY_NPS.get(n)?.get(s);
}

/** NPS → schedule → wall, so a lookup builds no key string. */
const WALLS_BY_NPS: ReadonlyMap<string, ReadonlyMap<string, PipeWall>> = (() => {
  const out = new Map<string, Map<string, PipeWall>>();
  for (const w of WALLS.values()) {
    let m = out.get(w.nps);
    if (!m) out.set(w.nps, (m = new Map()));
    m.set(w.schedule, w);
  }
  return out;
})();

/**
 * Every schedule listed for this NPS (both standards), sorted by wall ascending; ties keep a
 * stable order: numbered, then STD/XS/XXS, then S. Empty when the NPS is not listed.
 */
export function listPipeWalls(nps: string): PipeWall[] {
  const n = canonicalNps(nps);
  return n === undefined ? [] : [...(WALL_LISTS.get(n) ?? [])];
}

/** NPS numeric value (e.g. 1.5) for a canonical string; NaN when it is not an NPS. */
export function npsToNumber(nps: string): number {
  return NPS_VALUE.get(nps) ?? parseNpsNumber(nps);
}

// ---------------------------------------------------------------------------------------
// Standards and schedule choices

const STAINLESS_SET = new Set(STAINLESS_SCHEDULES);

/**
 * The dimension standard that lists a schedule: the "S" schedules 5S, 10S, 40S, 80S are
 * ASME B36.19M; every other designation (10…160, STD, XS, XXS) is ASME B36.10M. A trailing
 * "S" alone says nothing: XS and XXS are B36.10M weights.
 */
export function scheduleStandard(schedule: string): PipeStandard {
  return STAINLESS_SET.has(schedule) ? 'B36.19M' : 'B36.10M';
}

/**
 * One wall of one standard for an NPS, with every schedule name that gives exactly that wall
 * (e.g. NPS 2 "80" and "XS" in B36.10M). Shared, frozen objects: no allocation per lookup.
 */
export interface ScheduleChoice {
  /** The first name, in the tables' order (numbered before STD/XS/XXS): what "use it" sets. */
  readonly schedule: string;
  /** Every name with this wall in this standard, e.g. ["80", "XS"]. */
  readonly names: readonly string[];
  readonly standard: PipeStandard;
  readonly odIn: number;
  readonly odMm: number;
  readonly wallIn: number;
  readonly wallMm: number;
  /** "80 / XS (ASME B36.10M)". */
  readonly label: string;
}

function buildChoices(): Record<PipeStandard, Map<string, readonly ScheduleChoice[]>> {
  const out: Record<PipeStandard, Map<string, readonly ScheduleChoice[]>> = {
    'B36.10M': new Map(),
    'B36.19M': new Map(),
  };
  for (const [nps, walls] of WALL_LISTS) {
    for (const standard of ['B36.10M', 'B36.19M'] as const) {
      const own = walls.filter((w) => w.standard === standard);
      const choices: ScheduleChoice[] = [];
      for (let i = 0; i < own.length; ) {
        const first = own[i]!;
        const names: string[] = [];
        let j = i;
        while (j < own.length && own[j]!.wallIn === first.wallIn) names.push(own[j++]!.schedule);
        choices.push(
          Object.freeze({
            schedule: first.schedule,
            names: Object.freeze(names),
            standard,
            odIn: first.odIn,
            odMm: first.odMm,
            wallIn: first.wallIn,
            wallMm: first.wallMm,
            label: `${names.join(' / ')} (ASME ${standard})`,
          }),
        );
        i = j;
      }
      out[standard].set(nps, Object.freeze(choices));
    }
  }
  return out;
}

const CHOICES = buildChoices();
const NO_CHOICES: readonly ScheduleChoice[] = Object.freeze([]);

/**
 * The walls one standard lists for a canonical NPS, lightest first, equal walls merged into one
 * choice that names them all. Empty when the standard does not list the size. Scope
 * [ASME B36.10M / B36.19M]: B36.10M lists 10…160, STD, XS, XXS; B36.19M lists 5S, 10S, 40S, 80S.
 */
export function listScheduleChoices(
  nps: string,
  standard: PipeStandard,
): readonly ScheduleChoice[] {
  return CHOICES[standard].get(nps) ?? NO_CHOICES;
}

/** True when the string is already a canonical NPS (a fast check before `normalizeNps`). */
export function isCanonicalNps(nps: string): boolean {
  return NPS_VALUE.has(nps);
}

/** True when the string is already a canonical schedule (a fast check before `normalizeSchedule`). */
export function isCanonicalSchedule(schedule: string): boolean {
  return SCHEDULE_SET.has(schedule);
}
