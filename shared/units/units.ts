import type { UnitSystem } from '../model/spool';

/**
 * Unit systems and conversions — the only module with conversion factors.
 * imperial: in, psi, °F · metric: mm, MPa, °C. Stresses use pressure units.
 */

export const MM_PER_IN = 25.4;
/** psi per MPa (1 MPa = 10⁶ Pa; 1 psi = 6894.757293168 Pa, exact by definition of lbf and in). */
export const PSI_PER_MPA = 1e6 / 6894.757293168;

export interface UnitLabels {
  readonly length: string;
  readonly pressure: string;
  readonly temperature: string;
}

export const UNIT_LABELS: Record<UnitSystem, UnitLabels> = {
  imperial: { length: 'in', pressure: 'psi', temperature: '°F' },
  metric: { length: 'mm', pressure: 'MPa', temperature: '°C' },
};

/** Length in inches → document units. */
export function lengthFromInches(inches: number, units: UnitSystem): number {
  return units === 'imperial' ? inches : inches * MM_PER_IN;
}
/** Length in document units → inches. */
export function lengthToInches(value: number, units: UnitSystem): number {
  return units === 'imperial' ? value : value / MM_PER_IN;
}
/** Pressure or stress in psi → document units. */
export function pressureFromPsi(psi: number, units: UnitSystem): number {
  return units === 'imperial' ? psi : psi / PSI_PER_MPA;
}
/** Pressure or stress in document units → psi. */
export function pressureToPsi(value: number, units: UnitSystem): number {
  return units === 'imperial' ? value : value * PSI_PER_MPA;
}
/** Temperature in document units → °F. */
export function temperatureToF(value: number, units: UnitSystem): number {
  return units === 'imperial' ? value : (value * 9) / 5 + 32;
}
/** Temperature in °F → document units. */
export function temperatureFromF(f: number, units: UnitSystem): number {
  return units === 'imperial' ? f : ((f - 32) * 5) / 9;
}

export type Quantity = 'length' | 'pressure' | 'temperature';

/** Convert a value of a quantity between unit systems. */
export function convert(
  value: number,
  quantity: Quantity,
  from: UnitSystem,
  to: UnitSystem,
): number {
  if (from === to) return value;
  switch (quantity) {
    case 'length':
      return lengthFromInches(lengthToInches(value, from), to);
    case 'pressure':
      return pressureFromPsi(pressureToPsi(value, from), to);
    case 'temperature':
      return temperatureFromF(temperatureToF(value, from), to);
  }
}

/** kg per lb (exact, by definition of the international pound). */
export const KG_PER_LB = 0.45359237;
/** mm per ft and mm per m, for masses per length. */
export const MM_PER_FT = 12 * MM_PER_IN;

export interface MassLabels {
  /** Mass unit: lb | kg. */
  readonly mass: string;
  /** Long length unit for runs of pipe: ft | m. */
  readonly run: string;
  /** Mass per long length: lb/ft | kg/m. */
  readonly massPerRun: string;
}

export const MASS_LABELS: Record<UnitSystem, MassLabels> = {
  imperial: { mass: 'lb', run: 'ft', massPerRun: 'lb/ft' },
  metric: { mass: 'kg', run: 'm', massPerRun: 'kg/m' },
};

/** Mass in kg → document units (lb | kg). */
export function massFromKg(kg: number, units: UnitSystem): number {
  return units === 'imperial' ? kg / KG_PER_LB : kg;
}
/** Length in document units → millimetres. */
export function lengthToMm(value: number, units: UnitSystem): number {
  return lengthToInches(value, units) * MM_PER_IN;
}
/** Document length units (in | mm) per long run unit (ft | m). */
export function lengthPerRun(units: UnitSystem): number {
  return units === 'imperial' ? 12 : 1000;
}
/** Density in kg/m³ → lb/in³. */
export function densityToLbPerIn3(kgPerM3: number): number {
  return (kgPerM3 / KG_PER_LB) * (MM_PER_IN / 1000) ** 3;
}
