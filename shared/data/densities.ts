/**
 * Densities of the pipe materials, for masses (kg/m³). Every row names its source; rows recalled
 * from memory carry `fromMemory: true`. A material without its own row takes its category's.
 */
import type { Material } from './materials';

export interface Density {
  /** kg/m³. */
  readonly value: number;
  readonly source: string;
  readonly fromMemory: boolean;
}

/**
 * Carbon steel 7850 kg/m³ = 0.2836 lb/in³: the density behind the ASME B36.10M plain-end mass
 * formulas, M = 10.69·(D − t)·t lb/ft (in) and M = 0.0246615·(D − t)·t kg/m (mm):
 * 0.0246615 = 7850 × π × 10⁻⁶ and 10.69 ≈ 12·π·0.2836.
 */
export const CARBON_STEEL_DENSITY: Density = {
  value: 7850,
  source:
    'ASME B36.10M plain-end mass formula basis (10.69·(D − t)·t lb/ft; 0.0246615·(D − t)·t kg/m)',
  fromMemory: false,
};

const AUSTENITIC_304: Density = {
  value: 7930,
  source: 'type 304/304L stainless, 7.93 g/cm³ (published product data)',
  fromMemory: false,
};
const AUSTENITIC_316: Density = {
  value: 7980,
  source: 'type 316/316L stainless, 7.98 g/cm³ (published product data)',
  fromMemory: false,
};

const mem = (value: number, what: string): Density => ({
  value,
  source: `${what}, from memory, verify against the material's data`,
  fromMemory: true,
});

/** Rows by library material id. */
const BY_ID: Readonly<Record<string, Density>> = {
  'A106-B': CARBON_STEEL_DENSITY,
  'A53-B': CARBON_STEEL_DENSITY,
  'API5L-B': CARBON_STEEL_DENSITY,
  'A333-6': CARBON_STEEL_DENSITY,
  'A335-P11': mem(7860, '1¼Cr-½Mo steel 7.86 g/cm³'),
  'A335-P22': mem(7860, '2¼Cr-1Mo steel 7.86 g/cm³'),
  'A335-P5': mem(7780, '5Cr-½Mo steel 7.78 g/cm³'),
  'A335-P91': mem(7770, '9Cr-1Mo-V steel 7.77 g/cm³'),
  'A312-TP304': AUSTENITIC_304,
  'A312-TP304L': AUSTENITIC_304,
  'A312-TP316': AUSTENITIC_316,
  'A312-TP316L': AUSTENITIC_316,
  'A312-TP321': mem(7920, 'type 321 stainless 7.92 g/cm³'),
};

const BY_CATEGORY: Readonly<Record<Material['category'], Density>> = {
  carbon: CARBON_STEEL_DENSITY,
  'low-temp-carbon': CARBON_STEEL_DENSITY,
  'cr-mo': mem(7850, 'low-alloy Cr-Mo steel taken as carbon steel, 7.85 g/cm³'),
  austenitic: mem(7930, 'austenitic stainless taken as type 304, 7.93 g/cm³'),
  other: mem(7850, 'material of unknown density taken as carbon steel, 7.85 g/cm³'),
};

/** Density of a material (its own row, else its category's); carbon steel, flagged, when none is known. */
export function densityOf(material: Pick<Material, 'id' | 'category'> | null | undefined): Density {
  if (!material)
    return {
      ...CARBON_STEEL_DENSITY,
      source: `no material given: ${CARBON_STEEL_DENSITY.source} assumed`,
      fromMemory: true,
    };
  return BY_ID[material.id] ?? BY_CATEGORY[material.category] ?? BY_CATEGORY.other;
}

/** Water for the filled mass: 1000 kg/m³ (common practice; 998 kg/m³ at 21 °C). */
export const WATER_DENSITY: Density = {
  value: 1000,
  source: 'fresh water 1000 kg/m³ (common practice; 998 kg/m³ at 21 °C)',
  fromMemory: false,
};
