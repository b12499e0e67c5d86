/**
 * Bend geometry for the cut list (any consistent length unit). The sketcher draws with the same
 * rules: a bend of centreline radius R turning θ needs the tangent R·tan(θ/2) from each leg and
 * has a centreline arc R·θ.
 */

/** R·tan(θ/2): tangent point to the intersection of the leg centrelines; 0 for a 180° return bend (parallel legs). */
export function bendTangentLength(radius: number, angleDeg: number): number {
  if (angleDeg >= 180 - 1e-9) return 0;
  return radius * Math.tan((angleDeg * Math.PI) / 360);
}

/** R·θ, θ in radians: the centreline arc length of a bend. */
export function bendArcLength(radius: number, angleDeg: number): number {
  return (radius * angleDeg * Math.PI) / 180;
}
