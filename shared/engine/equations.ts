/**
 * The B31.3 wall-thickness equations as plain functions. Any consistent units.
 * Equation numbers follow ASME B31.3-2016 (older editions number the bend equations one higher).
 */

/** Eq. (3a), para. 304.1.2: pressure design thickness of straight pipe, t = P·D / (2·(S·E·W + P·Y)). */
export function straightThickness(
  P: number,
  D: number,
  S: number,
  E: number,
  W: number,
  Y: number,
): number {
  return (P * D) / (2 * (S * E * W + P * Y));
}

/** Eq. (3b), para. 304.1.2, inside-diameter form: t = P·(d + 2c) / (2·[S·E·W − P·(1 − Y)]). [from memory] */
export function straightThicknessFromId(
  P: number,
  d: number,
  c: number,
  S: number,
  E: number,
  W: number,
  Y: number,
): number {
  const den = 2 * (S * E * W - P * (1 - Y));
  return den > 0 ? (P * (d + 2 * c)) / den : Number.POSITIVE_INFINITY;
}

/** Eq. (3c), para. 304.2.1: pressure design thickness of a bend, t = P·D / (2·[(S·E·W / I) + P·Y]). */
export function bendThickness(
  P: number,
  D: number,
  S: number,
  E: number,
  W: number,
  Y: number,
  I: number,
): number {
  return (P * D) / (2 * ((S * E * W) / I + P * Y));
}

/** Eq. (3d): bend factor I at the intrados, I = (4·(R1/D) − 1) / (4·(R1/D) − 2). Needs R1/D > 0.5. */
export function intradosFactor(radiusOverD: number): number {
  return (4 * radiusOverD - 1) / (4 * radiusOverD - 2);
}

/** Eq. (3e): bend factor I at the extrados, I = (4·(R1/D) + 1) / (4·(R1/D) + 2). */
export function extradosFactor(radiusOverD: number): number {
  return (4 * radiusOverD + 1) / (4 * radiusOverD + 2);
}

/** Eq. (3a)/(3c) solved for P: the pressure a wall t holds, P = 2·(S·E·W/I)·t / (D − 2·Y·t). */
export function pressureForThickness(
  t: number,
  D: number,
  S: number,
  E: number,
  W: number,
  Y: number,
  I = 1,
): number {
  if (t <= 0) return 0;
  const den = D - 2 * Y * t;
  return den > 0 ? (2 * ((S * E * W) / I) * t) / den : Number.POSITIVE_INFINITY;
}

/** Table 304.1.1 note: Y for t ≥ D/6, Y = (d + 2c) / (D + d + 2c). */
export function thickWallY(D: number, d: number, c: number): number {
  return (d + 2 * c) / (D + d + 2 * c);
}

/** Roark, Table 35 case 19a: elastic collapse pressure of a long thin tube, q' = (1/4)·E/(1 − ν²)·(t/r)³. */
export function longTubeCollapsePressure(E: number, nu: number, t: number, r: number): number {
  return 0.25 * (E / (1 - nu * nu)) * (t / r) ** 3;
}
