import { getPipeSize, getPipeWall, normalizeNps, npsToNumber } from '@shared/data/pipe-dimensions';
import type { Bend, BendRadius, SpoolElement, UnitSystem } from '@shared/model/spool';
import { lengthFromInches } from '@shared/units/units';

/** Default bend radius of new bends when the spool has none: 3D (R1 = 3 × nominal size). */
export const FALLBACK_BEND_RADIUS: BendRadius = { multipleOfD: 3 };

/** Outside diameter drawn when an element's size cannot be resolved (in document units: 2 in). */
const FALLBACK_OD_IN = 2.375;

/**
 * Outside diameter D of an element in document units (in | mm): the explicit
 * `outsideDiameter`, else the NPS + schedule from ASME B36.10M/B36.19M (S schedules carry
 * the B36.19M OD), else the NPS alone, else `insideDiameter + 2 × nominalWall`.
 * Returns undefined when nothing resolves.
 */
export function resolveOutsideDiameter(el: SpoolElement, units: UnitSystem): number | undefined {
  if (el.outsideDiameter !== undefined) return el.outsideDiameter;
  if (el.nps !== undefined) {
    const nps = normalizeNps(el.nps);
    if (nps !== undefined) {
      const wall = el.schedule !== undefined ? getPipeWall(nps, String(el.schedule)) : undefined;
      if (wall) return units === 'imperial' ? wall.odIn : wall.odMm;
      const size = getPipeSize(nps);
      if (size) return units === 'imperial' ? size.odIn : size.odMm;
    }
  }
  if (el.insideDiameter !== undefined && el.nominalWall !== undefined)
    return el.insideDiameter + 2 * el.nominalWall;
  return undefined;
}

/** Outside diameter for drawing: as `resolveOutsideDiameter`, with a 2-in stand-in when unknown. */
export function drawnOutsideDiameter(el: SpoolElement, units: UnitSystem): number {
  return resolveOutsideDiameter(el, units) ?? lengthFromInches(FALLBACK_OD_IN, units);
}

/**
 * Centreline bend radius R1 in document units, as the check engine resolves it: a length as
 * given; `{ multipleOfD: n }` is n × the nominal size (shop practice: a "3D bend" has
 * R1 = 3 × NPS), or n × the outside diameter where the element has no NPS.
 */
export function resolveBendRadiusValue(radius: BendRadius, nominalSize: number): number {
  return typeof radius === 'number' ? radius : radius.multipleOfD * nominalSize;
}

/** Nominal size of an element in document units (NPS as a length), else its drawn OD. */
export function nominalSizeOf(el: SpoolElement, units: UnitSystem): number {
  if (el.nps !== undefined) {
    const nps = normalizeNps(el.nps);
    if (nps !== undefined) return lengthFromInches(npsToNumber(nps), units);
  }
  return drawnOutsideDiameter(el, units);
}

/** R1 of a bend in document units (see `resolveBendRadiusValue`). */
export function resolveBendRadius(bend: Bend, units: UnitSystem): number {
  return resolveBendRadiusValue(bend.bendRadius, nominalSizeOf(bend, units));
}

/**
 * Tangent need of a bend at each end: the distance from the bend's tangent point to the
 * intersection of the two leg centrelines, R·tan(θ/2). A 180° return bend has no
 * intersection; its legs are parallel, so it takes nothing from them (0).
 */
export function tangentLength(radius: number, angleDeg: number): number {
  if (angleDeg >= 180 - 1e-9) return 0;
  return radius * Math.tan((angleDeg * Math.PI) / 360);
}

/** Tangent need of a bend element (document units). */
export function bendTangent(bend: Bend, units: UnitSystem): number {
  return tangentLength(resolveBendRadius(bend, units), bend.angle);
}
