/**
 * Straight-line interpolation in a sorted table (B31.3 permits straight-line interpolation
 * between tabulated temperatures; nothing is ever extrapolated above the last point).
 */

export interface Interpolated {
  value: number;
  /** true when either bracketing point is from memory */
  fromMemory: boolean;
}

export interface TablePoint {
  x: number;
  y: number;
  fromMemory?: boolean;
}

/**
 * Straight-line interpolation in a table sorted by ascending x.
 * - Below the first x: the first value (tables start at their lowest listed temperature,
 *   e.g. "≤100 °F" covers everything below; a material's minimum temperature is checked elsewhere).
 * - At a tabulated x: that point's value (and only that point's fromMemory flag).
 * - Above the last x, an empty table or a non-finite x: undefined (never extrapolate).
 */
export function interpolate(points: readonly TablePoint[], x: number): Interpolated | undefined {
  if (!Number.isFinite(x) || points.length === 0) return undefined;
  const first = points[0]!;
  if (x <= first.x) return { value: first.y, fromMemory: first.fromMemory === true };
  for (let i = 1; i < points.length; i++) {
    const hi = points[i]!;
    if (x > hi.x) continue;
    if (x === hi.x) return { value: hi.y, fromMemory: hi.fromMemory === true };
    const lo = points[i - 1]!;
    const f = (x - lo.x) / (hi.x - lo.x);
    return {
      value: lo.y + (hi.y - lo.y) * f,
      fromMemory: lo.fromMemory === true || hi.fromMemory === true,
    };
  }
  return undefined;
}

/** The bracketing points used for x (for trails and source notes); undefined where interpolate is. */
export function bracket(
  points: readonly TablePoint[],
  x: number,
): { lo: TablePoint; hi: TablePoint; exact: boolean } | undefined {
  if (!Number.isFinite(x) || points.length === 0) return undefined;
  const first = points[0]!;
  if (x <= first.x) return { lo: first, hi: first, exact: true };
  for (let i = 1; i < points.length; i++) {
    const hi = points[i]!;
    if (x > hi.x) continue;
    if (x === hi.x) return { lo: hi, hi, exact: true };
    return { lo: points[i - 1]!, hi, exact: false };
  }
  return undefined;
}
