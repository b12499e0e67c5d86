/**
 * Pipe masses from the ring area and the material density. For carbon steel (7850 kg/m³) this is
 * the ASME B36.10M plain-end formula: 10.69·(D − t)·t lb/ft (in) or 0.0246615·(D − t)·t kg/m (mm).
 */
import type { UnitSystem } from '../model/spool';
import { lengthPerRun, lengthToMm, massFromKg } from '../units/units';

/** Mass per document length unit (lb/in | kg/mm) of pipe with outside diameter D and wall t (document units). */
export function pipeMassPerLength(
  D: number,
  t: number,
  densityKgM3: number,
  units: UnitSystem,
): number {
  const Dmm = lengthToMm(D, units);
  const tmm = lengthToMm(t, units);
  // kg per mm of pipe: ρ·π·(D − t)·t with mm² → m² and per m → per mm (10⁻⁹).
  const kgPerMm = densityKgM3 * Math.PI * (Dmm - tmm) * tmm * 1e-9;
  return massFromKg(kgPerMm * lengthToMm(1, units), units);
}

/** Mass per run unit (lb/ft | kg/m), the way pipe tables list it. */
export function pipeMassPerRun(
  D: number,
  t: number,
  densityKgM3: number,
  units: UnitSystem,
): number {
  return pipeMassPerLength(D, t, densityKgM3, units) * lengthPerRun(units);
}

/** Mass of the contents per document length unit (lb/in | kg/mm) for a bore of diameter d. */
export function contentMassPerLength(d: number, densityKgM3: number, units: UnitSystem): number {
  const dmm = lengthToMm(d, units);
  const kgPerMm = (densityKgM3 * Math.PI * dmm * dmm * 1e-9) / 4;
  return massFromKg(kgPerMm * lengthToMm(1, units), units);
}
