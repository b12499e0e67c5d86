/**
 * Materials library: B31.3 Table A-1 allowable stress S(T), yield Sy(T) where a table exists,
 * elastic modulus by B31.3 Table C-6 group, and the families that pick Y, W and E.
 * Stresses are stored as published (ksi) and served in psi; temperatures °F; moduli psi.
 * Every row names its source; values recalled from memory carry `fromMemory: true`.
 */
import type { ProductForm } from '../model/spool';
import { bracket, interpolate, type TablePoint } from './interpolate';

export type YFamily = 'ferritic' | 'austenitic' | 'nickel' | 'gray-iron' | 'other';
export type WFamily = 'carbon' | 'cr-mo' | 'csef' | 'austenitic' | 'nickel' | 'none';
export type ModulusGroup = 'carbon' | 'cr-mo-low' | 'cr-mo-2-1/4' | 'cr-mo-5-9' | 'austenitic';

export interface MaterialPoint {
  tempF: number;
  value: number;
  fromMemory?: boolean;
}

export interface Material {
  /** Library id, e.g. "A106-B", "A312-TP316L". */
  id: string;
  /** e.g. "ASTM A106". */
  spec: string;
  /** e.g. "B". */
  grade: string;
  /** e.g. "Carbon steel, seamless". */
  name: string;
  category: 'carbon' | 'low-temp-carbon' | 'cr-mo' | 'austenitic' | 'other';
  pNumber?: string;
  /** Specified minimum tensile strength, psi. */
  tensilePsi: number;
  /** Specified minimum yield strength, psi. */
  yieldPsi: number;
  /** Lowest temperature without impact testing, °F, where a source gives it. */
  minTempF?: number;
  yFamily: YFamily;
  wFamily: WFamily;
  modulusGroup: ModulusGroup;
  /** Product forms the specification covers. */
  productForms: ProductForm[];
  /** B31.3 Table A-1 basic allowable stress S(T), psi, ascending temperature. */
  stress: MaterialPoint[];
  /** Yield strength Sy(T), psi, where a table exists (provisional where noted). */
  yield?: MaterialPoint[];
  /** Source and edition of the rows; names the parts recalled from memory. */
  source: string;
  notes: string[];
}

export const FROM_MEMORY_NOTE = 'from memory, verify against the licensed edition';

// ---------------------------------------------------------------------------------------------
// Row builders
// ---------------------------------------------------------------------------------------------

/** ksi as published → psi (rounded to whole psi so 18.9 ksi is exactly 18 900 psi). */
const ksi = (v: number): number => Math.round(v * 1000);

function row(
  temps: readonly number[],
  valuesKsi: readonly number[],
  fromMemory: boolean,
): MaterialPoint[] {
  if (temps.length !== valuesKsi.length)
    throw new Error('material row: temperature and value counts differ');
  return temps.map((tempF, i) =>
    fromMemory
      ? { tempF, value: ksi(valuesKsi[i]!), fromMemory: true }
      : { tempF, value: ksi(valuesKsi[i]!) },
  );
}

// ---------------------------------------------------------------------------------------------
// Carbon steel line: A106 B, A53 B, API 5L B, A333 Gr 6
// ---------------------------------------------------------------------------------------------

const CS_PUB_T = [100, 200, 300, 400, 500, 600, 650, 700];
const CS_PUB_S = [20.0, 20.0, 20.0, 20.0, 18.9, 17.3, 17.0, 16.5];
const CS_MEM_T = [750, 800, 850, 900, 950, 1000];
const CS_MEM_S = [13.0, 10.8, 8.7, 6.5, 4.5, 2.5];
const carbonStress = (): MaterialPoint[] => [
  ...row(CS_PUB_T, CS_PUB_S, false),
  ...row(CS_MEM_T, CS_MEM_S, true),
];

const CS_SOURCE =
  "ASME B31.3 Table A-1: ≤100–700 °F as reproduced on a pipe mill's pressure–temperature rating page citing B31.3-2002 " +
  '(20.0 ksi at 400 °F and 18.9 ksi at 500 °F also on a second published rating page); 750–1000 °F ' +
  FROM_MEMORY_NOTE +
  '. Minimum yield 35 ksi per ASME B31.8 Appendix D.';

const CS_NOTES = [
  'Min. tensile 60 ksi, min. yield 35 ksi; P-No. 1.',
  `Values at 750–1000 °F are ${FROM_MEMORY_NOTE}.`,
  'The Table A-1 stress is listed for the material; the quality factor E comes from the product form (Table A-1B).',
];

const NO_MIN_TEMP =
  'No minimum temperature without impact testing is held for this material; check B31.3 para. 323.2.2 and Fig. 323.2.2A.';

// ---------------------------------------------------------------------------------------------
// Low-alloy ferritic: A335 (seamless)
// ---------------------------------------------------------------------------------------------

const A335_T = [100, 300, 400, 500, 600, 700, 800, 900, 1000, 1100, 1200];
const A335_SOURCE =
  'ASME B31.3 Table A-1 as reproduced on mill data sheets (edition not stated, probably 2010); the ≤100 °F value is derived as ST/3 (para. 302.3.2 basis)';
const A335_GAP =
  'The source reproduction omits the 200 °F column: values between 100 and 300 °F are interpolated across the gap and may differ from the tabulated 200 °F value; verify.';
const A335_NOTES = [
  'Seamless only (ASTM A335).',
  'The ≤100 °F value is ST/3, derived, not read from the sheet.',
  A335_GAP,
  NO_MIN_TEMP,
];

// ---------------------------------------------------------------------------------------------
// Austenitic stainless: A312 (P-No. 8)
// ---------------------------------------------------------------------------------------------

const SS_T = [100, 200, 300, 400, 500, 600, 650, 700, 750, 800, 850, 900, 950, 1000];
const A312_FORMS: ProductForm[] = [
  'seamless',
  'efw-single',
  'efw-double',
  'efw-spot-rt',
  'efw-full-rt',
];
const A312_MEM_SOURCE = `ASME B31.3 Table A-1, ≤100–1000 °F, ${FROM_MEMORY_NOTE}. Min. tensile/yield per ASTM A312.`;
const LOW_TEMP_425 = 'B31.3 accepts this grade to −425 °F without impact tests (A312 note).';

const TP316_MEM_T = [100, 200, 300, 400, 500, 600, 650, 700];
const TP316_MEM_S = [20.0, 20.0, 20.0, 19.3, 18.0, 17.0, 16.6, 16.3];
const TP316_PUB_T = [750, 800, 850, 900, 950, 1000, 1050, 1100, 1150, 1200];
const TP316_PUB_S = [16.1, 15.9, 15.7, 15.6, 15.4, 15.3, 14.5, 12.4, 9.8, 7.4];

// ---------------------------------------------------------------------------------------------
// Yield Sy(T) — II-D Table Y-1, provisional
// ---------------------------------------------------------------------------------------------

const YIELD_SOURCE = `provisional yield strength Sy(T) in the manner of ASME BPVC II-D Table Y-1, no published reproduction found; ${FROM_MEMORY_NOTE} (partly back-calculated from S)`;
const Y_106B = row(
  [100, 200, 300, 400, 500, 600, 650, 700],
  [35.0, 31.9, 31.0, 30.0, 28.3, 26.0, 25.5, 24.8],
  true,
);
const Y_T = [100, 200, 300, 400, 500, 600, 650, 700, 800, 900, 1000];
const Y_304 = row(Y_T, [30.0, 25.0, 22.4, 20.7, 19.4, 18.4, 18.0, 17.6, 16.9, 16.2, 15.5], true);
const Y_316 = row(Y_T, [30.0, 25.9, 23.4, 21.4, 20.0, 18.9, 18.5, 18.2, 17.7, 17.3, 17.0], true);
const NO_YIELD_TABLE =
  'No Sy(T) table is held: yieldStrengthAt reports it; callers use the specified minimum yield with a note, or an override.';

// ---------------------------------------------------------------------------------------------
// The library
// ---------------------------------------------------------------------------------------------

export const MATERIALS: readonly Material[] = [
  {
    id: 'A106-B',
    spec: 'ASTM A106',
    grade: 'B',
    name: 'Carbon steel, seamless',
    category: 'carbon',
    pNumber: '1',
    tensilePsi: ksi(60),
    yieldPsi: ksi(35),
    yFamily: 'ferritic',
    wFamily: 'carbon',
    modulusGroup: 'carbon',
    productForms: ['seamless'],
    stress: carbonStress(),
    yield: Y_106B,
    source: `${CS_SOURCE} Sy(T): ${YIELD_SOURCE}.`,
    notes: [
      ...CS_NOTES,
      `Sy(T) table (SA-106 B) is provisional, ${FROM_MEMORY_NOTE}.`,
      NO_MIN_TEMP,
    ],
  },
  {
    id: 'A53-B',
    spec: 'ASTM A53',
    grade: 'B',
    name: 'Carbon steel, seamless and electric resistance welded',
    category: 'carbon',
    pNumber: '1',
    tensilePsi: ksi(60),
    yieldPsi: ksi(35),
    yFamily: 'ferritic',
    wFamily: 'carbon',
    modulusGroup: 'carbon',
    productForms: ['seamless', 'erw'],
    stress: carbonStress(),
    source: CS_SOURCE,
    notes: [
      ...CS_NOTES,
      'ERW: E = 0.85 (Table A-1B) from the product form; S is the same row.',
      NO_YIELD_TABLE,
      NO_MIN_TEMP,
    ],
  },
  {
    id: 'API5L-B',
    spec: 'API 5L',
    grade: 'B',
    name: 'Carbon steel line pipe, seamless and electric resistance welded',
    category: 'carbon',
    pNumber: '1',
    tensilePsi: ksi(60),
    yieldPsi: ksi(35),
    yFamily: 'ferritic',
    wFamily: 'carbon',
    modulusGroup: 'carbon',
    productForms: ['seamless', 'erw'],
    stress: carbonStress(),
    source: CS_SOURCE,
    notes: [
      ...CS_NOTES,
      'SAW pipe: E = 0.95 (Table A-1B); no product form selects it, enter E as an override.',
      NO_YIELD_TABLE,
      NO_MIN_TEMP,
    ],
  },
  {
    id: 'A333-6',
    spec: 'ASTM A333',
    grade: '6',
    name: 'Carbon steel for low-temperature service, seamless and welded',
    category: 'low-temp-carbon',
    pNumber: '1',
    tensilePsi: ksi(60),
    yieldPsi: ksi(35),
    minTempF: -50,
    yFamily: 'ferritic',
    wFamily: 'carbon',
    modulusGroup: 'carbon',
    productForms: ['seamless', 'erw'],
    stress: carbonStress(),
    source: `${CS_SOURCE} Minimum temperature −50 °F per published product sheets.`,
    notes: [...CS_NOTES, 'Minimum temperature −50 °F (product sheets).', NO_YIELD_TABLE],
  },
  {
    id: 'A335-P11',
    spec: 'ASTM A335',
    grade: 'P11',
    name: '1¼Cr-½Mo alloy steel, seamless',
    category: 'cr-mo',
    tensilePsi: ksi(60),
    yieldPsi: ksi(30),
    yFamily: 'ferritic',
    wFamily: 'cr-mo',
    modulusGroup: 'cr-mo-low',
    productForms: ['seamless'],
    stress: row(A335_T, [20.0, 18.0, 17.5, 17.2, 16.7, 15.6, 15.0, 12.8, 6.3, 2.8, 1.2], false),
    source: A335_SOURCE,
    notes: [...A335_NOTES, NO_YIELD_TABLE],
  },
  {
    id: 'A335-P22',
    spec: 'ASTM A335',
    grade: 'P22',
    name: '2¼Cr-1Mo alloy steel, seamless',
    category: 'cr-mo',
    tensilePsi: ksi(60),
    yieldPsi: ksi(30),
    yFamily: 'ferritic',
    wFamily: 'cr-mo',
    modulusGroup: 'cr-mo-2-1/4',
    productForms: ['seamless'],
    stress: row(A335_T, [20.0, 18.0, 17.9, 17.9, 17.9, 17.9, 17.8, 12.8, 7.8, 3.2, 1.6], false),
    source: A335_SOURCE,
    notes: [...A335_NOTES, NO_YIELD_TABLE],
  },
  {
    id: 'A335-P5',
    spec: 'ASTM A335',
    grade: 'P5',
    name: '5Cr-½Mo alloy steel, seamless',
    category: 'cr-mo',
    tensilePsi: ksi(60),
    yieldPsi: ksi(30),
    yFamily: 'ferritic',
    wFamily: 'cr-mo',
    modulusGroup: 'cr-mo-5-9',
    productForms: ['seamless'],
    stress: row(A335_T, [20.0, 17.4, 17.2, 17.1, 16.8, 16.3, 12.8, 10.9, 5.8, 2.9, 1.0], false),
    source: A335_SOURCE,
    notes: [...A335_NOTES, NO_YIELD_TABLE],
  },
  {
    id: 'A335-P91',
    spec: 'ASTM A335',
    grade: 'P91',
    name: '9Cr-1Mo-V alloy steel (CSEF), seamless',
    category: 'cr-mo',
    tensilePsi: ksi(85),
    yieldPsi: ksi(60),
    yFamily: 'ferritic',
    wFamily: 'csef',
    modulusGroup: 'cr-mo-5-9',
    productForms: ['seamless'],
    stress: row(A335_T, [28.3, 28.3, 28.2, 28.1, 27.7, 26.7, 24.9, 22.3, 18.0, 10.3, 4.3], false),
    source: A335_SOURCE,
    notes: [
      ...A335_NOTES,
      'W family CSEF: no CSEF row of Table 302.3.5 is embedded; welded P91 needs W entered or verified.',
      NO_YIELD_TABLE,
    ],
  },
  {
    id: 'A312-TP304',
    spec: 'ASTM A312',
    grade: 'TP304',
    name: 'Austenitic stainless steel 304, seamless and welded',
    category: 'austenitic',
    pNumber: '8',
    tensilePsi: ksi(75),
    yieldPsi: ksi(30),
    minTempF: -425,
    yFamily: 'austenitic',
    wFamily: 'austenitic',
    modulusGroup: 'austenitic',
    productForms: A312_FORMS,
    stress: row(
      SS_T,
      [20.0, 20.0, 20.0, 18.6, 17.5, 16.6, 16.2, 15.8, 15.5, 15.2, 14.9, 14.6, 14.3, 14.0],
      true,
    ),
    yield: Y_304,
    source: `${A312_MEM_SOURCE} Sy(T): ${YIELD_SOURCE}.`,
    notes: [
      `All S values ${FROM_MEMORY_NOTE}.`,
      `Sy(T) table (304) is provisional, ${FROM_MEMORY_NOTE}.`,
      LOW_TEMP_425,
    ],
  },
  {
    id: 'A312-TP304L',
    spec: 'ASTM A312',
    grade: 'TP304L',
    name: 'Austenitic stainless steel 304L, seamless and welded',
    category: 'austenitic',
    pNumber: '8',
    tensilePsi: ksi(70),
    yieldPsi: ksi(25),
    minTempF: -425,
    yFamily: 'austenitic',
    wFamily: 'austenitic',
    modulusGroup: 'austenitic',
    productForms: A312_FORMS,
    stress: row(
      SS_T,
      [16.7, 16.7, 16.7, 15.8, 14.7, 14.0, 13.7, 13.5, 13.3, 13.0, 12.8, 12.6, 12.3, 12.0],
      true,
    ),
    source: A312_MEM_SOURCE,
    notes: [`All S values ${FROM_MEMORY_NOTE}.`, NO_YIELD_TABLE, LOW_TEMP_425],
  },
  {
    id: 'A312-TP316',
    spec: 'ASTM A312',
    grade: 'TP316',
    name: 'Austenitic stainless steel 316, seamless and welded',
    category: 'austenitic',
    pNumber: '8',
    tensilePsi: ksi(75),
    yieldPsi: ksi(30),
    yFamily: 'austenitic',
    wFamily: 'austenitic',
    modulusGroup: 'austenitic',
    productForms: A312_FORMS,
    stress: [...row(TP316_MEM_T, TP316_MEM_S, true), ...row(TP316_PUB_T, TP316_PUB_S, false)],
    yield: Y_316,
    source:
      `ASME B31.3 Table A-1: ≤100–700 °F ${FROM_MEMORY_NOTE}; 750–1200 °F as reproduced on a published pressure–temperature sheet for A312/A376 TP316 (edition not stated). ` +
      `Min. tensile/yield per ASTM A312. Sy(T): ${YIELD_SOURCE}.`,
    notes: [
      `Values ≤700 °F are ${FROM_MEMORY_NOTE}.`,
      `1050 °F: 14.5 ksi per the sheet; newer editions 15.1 ksi (${FROM_MEMORY_NOTE}).`,
      'A second published vendor reproduction of Table A-1 (edition uncertain) lists 17.9 ksi at 500 °F, 16.7 at 650 °F, 15.5 at 900 °F and 9.6 at 1150 °F; the sheet values are used here.',
      `Sy(T) table (316) is provisional, ${FROM_MEMORY_NOTE}.`,
      NO_MIN_TEMP,
    ],
  },
  {
    id: 'A312-TP316L',
    spec: 'ASTM A312',
    grade: 'TP316L',
    name: 'Austenitic stainless steel 316L, seamless and welded',
    category: 'austenitic',
    pNumber: '8',
    tensilePsi: ksi(70),
    yieldPsi: ksi(25),
    yFamily: 'austenitic',
    wFamily: 'austenitic',
    modulusGroup: 'austenitic',
    productForms: A312_FORMS,
    stress: row(
      SS_T,
      [16.7, 16.7, 16.7, 15.7, 14.8, 14.0, 13.7, 13.5, 13.2, 12.9, 12.7, 12.4, 12.1, 11.8],
      true,
    ),
    source: A312_MEM_SOURCE,
    notes: [`All S values ${FROM_MEMORY_NOTE}.`, NO_YIELD_TABLE, NO_MIN_TEMP],
  },
  {
    id: 'A312-TP321',
    spec: 'ASTM A312',
    grade: 'TP321',
    name: 'Austenitic stainless steel 321, seamless and welded',
    category: 'austenitic',
    pNumber: '8',
    tensilePsi: ksi(75),
    yieldPsi: ksi(30),
    yFamily: 'austenitic',
    wFamily: 'austenitic',
    modulusGroup: 'austenitic',
    productForms: A312_FORMS,
    stress: row(
      SS_T,
      [20.0, 20.0, 20.0, 20.0, 19.3, 18.3, 17.9, 17.5, 17.2, 16.9, 16.7, 16.5, 16.4, 16.2],
      true,
    ),
    source: A312_MEM_SOURCE,
    notes: [`All S values ${FROM_MEMORY_NOTE}.`, NO_YIELD_TABLE, NO_MIN_TEMP],
  },
];

/** Notes for stretches of a stress row where the source omits a column (keyed by row object). */
const GAP_NOTES = new WeakMap<
  readonly MaterialPoint[],
  { fromF: number; toF: number; note: string }
>();
/** Source of each built-in row on its own (the material's `source` names all its rows). */
const ROW_SOURCES = new WeakMap<readonly MaterialPoint[], string>();
for (const m of MATERIALS) {
  if (m.spec === 'ASTM A335') GAP_NOTES.set(m.stress, { fromF: 100, toF: 300, note: A335_GAP });
  const cut = m.source.indexOf(' Sy(T): ');
  if (cut >= 0) {
    ROW_SOURCES.set(m.stress, m.source.slice(0, cut));
    if (m.yield !== undefined) ROW_SOURCES.set(m.yield, YIELD_SOURCE);
  }
}

// ---------------------------------------------------------------------------------------------
// Finding materials
// ---------------------------------------------------------------------------------------------

/** Upper-case, drop ASTM/ASME/GRADE/GR/TYPE words and separators, SA-xxx → Axxx. */
export function normalizeMaterialKey(s: string): string {
  const tokens = s
    .toUpperCase()
    .split(/[^A-Z0-9]+/)
    .filter((t) => t !== '' && !['ASTM', 'ASME', 'GRADE', 'GR', 'TYPE', 'CLASS'].includes(t));
  let k = tokens.join('');
  k = k.replace(/^SA(?=\d)/, 'A');
  // "A106GRB", "API5LGRB", "A333GR6": a "GR" glued after the spec number.
  k = k.replace(/^(A\d+|API5L)GR(?=[A-Z0-9])/, '$1');
  return k;
}

function fullKeys(m: Material): string[] {
  const keys = new Set<string>([
    normalizeMaterialKey(m.id),
    normalizeMaterialKey(`${m.spec} ${m.grade}`),
  ]);
  const g = normalizeMaterialKey(m.grade);
  if (g.startsWith('TP')) keys.add(normalizeMaterialKey(`${m.spec} ${g.slice(2)}`));
  return [...keys];
}

/** Grade-only spellings ("316L", "TP316L", "P91"); used only where exactly one material has them. */
function gradeKeys(m: Material): string[] {
  const g = normalizeMaterialKey(m.grade);
  const keys = new Set<string>();
  if (g.length >= 2 && /\d/.test(g)) keys.add(g);
  if (g.startsWith('TP') && g.length > 3) keys.add(g.slice(2));
  return [...keys].filter((k) => k.length >= 2);
}

function buildIndex(list: readonly Material[]): (idOrSpec: string) => Material | undefined {
  const full = new Map<string, Material>();
  const byId = new Map<string, Material>();
  for (const m of list) {
    const idKey = normalizeMaterialKey(m.id);
    if (!byId.has(idKey)) byId.set(idKey, m);
  }
  const distinct = [...byId.values()];
  for (const m of distinct) for (const k of fullKeys(m)) if (!full.has(k)) full.set(k, m);
  const grade = new Map<string, Material | null>();
  for (const m of distinct) {
    for (const k of gradeKeys(m)) {
      if (full.has(k) && full.get(k) !== m) continue;
      const prev = grade.get(k);
      grade.set(k, prev === undefined || prev === m ? m : null);
    }
  }
  return (idOrSpec: string) => {
    if (typeof idOrSpec !== 'string') return undefined;
    const k = normalizeMaterialKey(idOrSpec);
    if (k === '') return undefined;
    return byId.get(k) ?? full.get(k) ?? grade.get(k) ?? undefined;
  };
}

const builtinIndex = buildIndex(MATERIALS);

/**
 * Find a material by id or loose spelling: "A106-B", "a106 b", "A106 Gr B", "SA-106 B", "A312-TP316L",
 * "A312 316L", and a bare grade such as "316L" or "P91" where only one material has it. undefined when unknown.
 */
export function findMaterial(idOrSpec: string): Material | undefined {
  return builtinIndex(idOrSpec);
}

/**
 * A lookup over project/team materials and the library: extra materials are searched first (an extra
 * material with a library id replaces the library row); a bare grade resolves only when unambiguous
 * over the combined list.
 */
export function createMaterialLookup(
  extra: readonly Material[],
): (idOrSpec: string) => Material | undefined {
  return buildIndex([...extra, ...MATERIALS]);
}

// ---------------------------------------------------------------------------------------------
// Lookups at temperature
// ---------------------------------------------------------------------------------------------

export type Lookup =
  | { ok: true; value: number; fromMemory: boolean; source: string }
  | { ok: false; reason: string };

const fmtT = (t: number): string => `${Math.round(t * 100) / 100} °F`;

function range(points: readonly MaterialPoint[]): string {
  const first = points[0]!;
  const last = points[points.length - 1]!;
  return `≤${fmtT(first.tempF)} to ${fmtT(last.tempF)}`;
}

function toTable(points: readonly MaterialPoint[]): TablePoint[] {
  return points.map((p) => ({ x: p.tempF, y: p.value, fromMemory: p.fromMemory }));
}

function lookupRow(
  points: readonly MaterialPoint[],
  tempF: number,
  what: string,
  source: string,
  gap?: { fromF: number; toF: number; note: string },
): Lookup {
  if (!Number.isFinite(tempF)) return { ok: false, reason: `${what}: temperature is not a number` };
  if (points.length === 0) return { ok: false, reason: `${what}: no tabulated values` };
  const table = toTable(points);
  const r = interpolate(table, tempF);
  if (r === undefined) {
    return {
      ok: false,
      reason: `${what}: ${fmtT(tempF)} is above the highest tabulated temperature ${fmtT(points[points.length - 1]!.tempF)} (table covers ${range(points)}); values are never extrapolated`,
    };
  }
  const b = bracket(table, tempF)!;
  let where = b.exact
    ? tempF < table[0]!.x
      ? `at ${fmtT(tempF)} (the ≤${fmtT(table[0]!.x)} value)`
      : `at ${fmtT(tempF)}`
    : `at ${fmtT(tempF)}, interpolated between ${fmtT(b.lo.x)} and ${fmtT(b.hi.x)}`;
  if (gap !== undefined && !b.exact && b.lo.x === gap.fromF && b.hi.x === gap.toF)
    where += ` (${gap.note})`;
  return {
    ok: true,
    value: r.value,
    fromMemory: r.fromMemory,
    source: `${source.replace(/\.\s*$/, '')}; ${what} ${where}${r.fromMemory ? ` — ${FROM_MEMORY_NOTE}` : ''}`,
  };
}

function belowMinimum(m: Material, tempF: number, what: string): Lookup | undefined {
  if (m.minTempF !== undefined && tempF < m.minTempF) {
    return {
      ok: false,
      reason: `${what}: ${fmtT(tempF)} is below ${m.id}'s minimum temperature ${fmtT(m.minTempF)} without impact testing (table covers ${range(m.stress)})`,
    };
  }
  return undefined;
}

/** Allowable stress S (psi) at tempF; reason names the table range when above the top temperature or below minTempF. */
export function allowableStressAt(m: Material, tempF: number): Lookup {
  const what = `${m.id} allowable stress S`;
  return (
    belowMinimum(m, tempF, what) ??
    lookupRow(m.stress, tempF, what, ROW_SOURCES.get(m.stress) ?? m.source, GAP_NOTES.get(m.stress))
  );
}

/**
 * Yield strength Sy (psi) at tempF from the material's yield table. Where the material has no yield
 * table, ok: false with a reason saying so (callers may then use the specified minimum yield
 * `m.yieldPsi` with a note, or an override).
 */
export function yieldStrengthAt(m: Material, tempF: number): Lookup {
  const what = `${m.id} yield strength Sy`;
  if (m.yield === undefined || m.yield.length === 0) {
    return {
      ok: false,
      reason: `${what}: no yield-versus-temperature table is held for ${m.id}; the specified minimum yield is ${m.yieldPsi} psi at room temperature`,
    };
  }
  return (
    belowMinimum(m, tempF, what) ??
    lookupRow(m.yield, tempF, what, ROW_SOURCES.get(m.yield) ?? m.source)
  );
}

// ---------------------------------------------------------------------------------------------
// Elastic modulus — B31.3-2010 Table C-6 / B31.1-1995 Appendix C values
// ---------------------------------------------------------------------------------------------

export const MODULUS_SOURCE = 'ASME B31.3-2010 Table C-6 (B31.1-1995 Appendix C values)';

const MOD_T = [-325, -200, -100, 70, 200, 300, 400, 500, 600, 700, 800, 900, 1000, 1100, 1200];
const mpsi = (temps: readonly number[], values: readonly number[]): MaterialPoint[] =>
  temps.map((tempF, i) => ({ tempF, value: Math.round(values[i]! * 1e5) * 10 }));

/** Modulus of elasticity, psi, by group. */
export const MODULUS_TABLE: Readonly<Record<ModulusGroup, readonly MaterialPoint[]>> = {
  carbon: mpsi(
    MOD_T.slice(0, 14),
    [31.4, 30.8, 30.2, 29.5, 28.8, 28.3, 27.7, 27.3, 26.7, 25.5, 24.2, 22.4, 20.4, 18.0],
  ),
  'cr-mo-low': mpsi(
    MOD_T,
    [31.6, 31.0, 30.4, 29.7, 29.0, 28.5, 27.9, 27.5, 26.9, 26.3, 25.5, 24.8, 23.9, 23.0, 21.8],
  ),
  'cr-mo-2-1/4': mpsi(
    MOD_T,
    [32.6, 32.0, 31.4, 30.6, 29.8, 29.4, 28.8, 28.3, 27.7, 27.1, 26.3, 25.6, 24.6, 23.7, 22.5],
  ),
  'cr-mo-5-9': mpsi(
    MOD_T,
    [32.9, 32.3, 31.7, 30.9, 30.1, 29.7, 29.0, 28.6, 28.0, 27.3, 26.1, 24.7, 22.7, 20.4, 18.2],
  ),
  austenitic: mpsi(
    MOD_T,
    [30.3, 29.7, 29.1, 28.3, 27.6, 27.0, 26.5, 25.8, 25.3, 24.8, 24.1, 23.5, 22.8, 22.1, 21.2],
  ),
};

const MODULUS_GROUP_LABEL: Readonly<Record<ModulusGroup, string>> = {
  carbon: 'carbon steel C ≤ 0.3 %',
  'cr-mo-low': 'Cr-Mo ½–2 % Cr',
  'cr-mo-2-1/4': 'Cr-Mo 2¼–3 % Cr',
  'cr-mo-5-9': 'Cr-Mo 5–9 % Cr',
  austenitic: 'austenitic stainless',
};

/** Elastic modulus (psi) at tempF for a B31.3 Table C-6 group; below −325 °F the −325 °F value. */
export function elasticModulusAt(group: ModulusGroup, tempF: number): Lookup {
  const points = MODULUS_TABLE[group];
  if (points === undefined)
    return { ok: false, reason: `unknown modulus group "${String(group)}"` };
  return lookupRow(
    points,
    tempF,
    `elastic modulus (${MODULUS_GROUP_LABEL[group]})`,
    MODULUS_SOURCE,
  );
}
