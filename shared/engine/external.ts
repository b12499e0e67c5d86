/**
 * External pressure, B31.3 para. 304.1.3 → BPVC VIII-1 UG-28 (geometric factor A) with the
 * allowable from the closed-form procedure of BPVC VIII-2 para. 4.4.5.1 [from memory, verify].
 * Any consistent units: Do, t, L lengths; Ey, Sy, S stresses/pressures.
 */

/** UG-28 factor A from geometry [from memory]: the larger of the long-cylinder and finite-length forms; L/Do capped at 50. */
export function factorA(Do: number, t: number, L: number): number {
  const ratio = Do / t;
  const longA = 1.1 / ratio ** 2;
  const lOverD = Math.min(L / Do, 50);
  const den = lOverD - 0.45 * Math.sqrt(t / Do);
  const finiteA = den > 0 ? (1.3 * (t / Do) ** 1.5) / den : Number.POSITIVE_INFINITY;
  return Math.max(longA, finiteA);
}

export interface ExternalAllowable {
  /** Allowable external pressure. */
  readonly Pa: number;
  readonly A: number;
  readonly Mx: number;
  readonly Ch: number;
  readonly Fhe: number;
  readonly Fic: number;
  readonly FS: number;
  readonly Fha: number;
  /** UG-28 elastic value 2·A·E / (3·(Do/t)), valid only left of the material line. */
  readonly PaElastic: number;
  /** UG-28(c) Do/t < 10 plastic limit 2S/(Do/t)·(1 − 1/(Do/t)), S = min(1.5·S, 0.9·Sy); null for Do/t ≥ 10. */
  readonly PaThick: number | null;
}

/**
 * Allowable external pressure of a cylinder with effective wall t (after mill tolerance and
 * corrosion). VIII-2 4.4.5.1 closed form; for Do/t < 10 also capped by the UG-28(c) plastic limit.
 */
export function externalAllowable(Do: number, t: number, L: number, Ey: number, Sy: number, S: number): ExternalAllowable {
  const ratio = Do / t;
  const A = factorA(Do, t, L);
  const Ro = Do / 2;
  // L capped at 50·Do like the chart, so an "infinitely long" cylinder stays finite.
  const Leff = Math.min(L, 50 * Do);
  const Mx = Leff / Math.sqrt(Ro * t);
  const mxLimit = 2 * ratio ** 0.94;
  let Ch: number;
  if (Mx >= mxLimit) Ch = 0.55 * (t / Do);
  else if (Mx > 13) Ch = 1.12 * Mx ** -1.058;
  else if (Mx > 1.5) Ch = 0.92 / (Mx - 0.579);
  else Ch = 1.0;
  const Fhe = (1.6 * Ch * Ey * t) / Do;
  const r = Fhe / Sy;
  let Fic: number;
  if (r >= 2.439) Fic = Sy;
  else if (r > 0.552) Fic = 0.7 * Sy * r ** 0.4;
  else Fic = Fhe;
  let FS: number;
  if (Fic <= 0.55 * Sy) FS = 2.0;
  else if (Fic >= Sy) FS = 1.667;
  else FS = 2.407 - 0.741 * (Fic / Sy);
  const Fha = Fic / FS;
  let Pa = 2 * Fha * (t / Do);
  const PaElastic = (2 * A * Ey) / (3 * ratio);
  let PaThick: number | null = null;
  if (ratio < 10) {
    const Sb = Math.min(1.5 * S, 0.9 * Sy);
    PaThick = ((2 * Sb) / ratio) * (1 - 1 / ratio);
    Pa = Math.min(Pa, PaThick);
  }
  return { Pa, A, Mx, Ch, Fhe, Fic, FS, Fha, PaElastic, PaThick };
}

/**
 * Smallest effective wall t with allowable external pressure ≥ Pext (bisection; Pa rises with t).
 * Returns Do/2 when even a solid section would not hold (then the case fails).
 */
export function minimumExternalWall(Do: number, Pext: number, L: number, Ey: number, Sy: number, S: number): number {
  if (Pext <= 0) return 0;
  let lo = 0;
  let hi = Do / 2;
  if (externalAllowable(Do, hi, L, Ey, Sy, S).Pa < Pext) return hi;
  for (let i = 0; i < 60 && hi - lo > 1e-9 * Do; i++) {
    const mid = (lo + hi) / 2;
    if (mid > 0 && externalAllowable(Do, mid, L, Ey, Sy, S).Pa >= Pext) hi = mid;
    else lo = mid;
  }
  return hi;
}
