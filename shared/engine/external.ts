/**
 * External pressure, B31.3 para. 304.1.3 → BPVC VIII-1 UG-28. Every relation in this file is
 * recalled from memory (verify against the licensed editions):
 * - UG-28 factor A from geometry (the relations behind the geometric chart, Fig. G) [from memory];
 * - UG-28(c)(1), Do/t ≥ 10, elastic range (A left of the material line, B = A·E/2):
 *   Pa = 4B/(3·Do/t) = 2·A·E / (3·(Do/t)) [from memory];
 * - UG-28(c)(2), Do/t < 10: A = 1.1/(Do/t)² for Do/t < 4; Pa1 = [2.167/(Do/t) − 0.0833]·B,
 *   Pa2 = [2S/(Do/t)]·[1 − 1/(Do/t)], S = min(1.5·S, 0.9·Sy); Pa = min(Pa1, Pa2) [from memory];
 * - BPVC VIII-2 para. 4.4.5.1 closed form, which models the inelastic knee [from memory].
 * With no material chart (factor B) embedded, the allowable is the LOWER of the UG-28 value and the
 * VIII-2 value: alone, the VIII-2 form is about 20 % above UG-28 in the long elastic range.
 * Any consistent units: Do, t, L lengths; Ey, Sy, S stresses/pressures.
 */

/** Which relation gives the allowable external pressure. */
export type ExternalBasis = 'ug28-elastic' | 'ug28-thick' | 'viii2';

/** Labels for the trail, the inspector and the checker; each says it is recalled from memory. */
export const EXTERNAL_BASIS_LABEL: Readonly<Record<ExternalBasis, string>> = {
  'ug28-elastic': 'VIII-1 UG-28 elastic, B = A·E/2 (from memory)',
  'ug28-thick': 'VIII-1 UG-28(c)(2), Do/t < 10 (from memory)',
  viii2: 'VIII-2 4.4.5.1 closed form (from memory)',
};

/** UG-28 factor A from geometry [from memory]: the larger of the long-cylinder and finite-length forms; L/Do capped at 50. */
export function factorA(Do: number, t: number, L: number): number {
  const ratio = Do / t;
  const longA = 1.1 / (ratio * ratio);
  const lOverD = Math.min(L / Do, 50);
  const den = lOverD - 0.45 * Math.sqrt(t / Do);
  const finiteA = den > 0 ? (1.3 * (t / Do) ** 1.5) / den : Number.POSITIVE_INFINITY;
  return Math.max(longA, finiteA);
}

export interface ExternalAllowable {
  /** Allowable external pressure: min(PaUg28, PaVIII2). */
  readonly Pa: number;
  /** Which relation gives Pa. */
  readonly basis: ExternalBasis;
  /** UG-28 value: Do/t ≥ 10 the elastic 2·A·E/(3·(Do/t)); Do/t < 10 min(Pa1 with B = A·E/2, Pa2). */
  readonly PaUg28: number;
  /** VIII-2 4.4.5.1 closed-form value 2·Fha·(t/Do). */
  readonly PaVIII2: number;
  readonly A: number;
  readonly Mx: number;
  readonly Ch: number;
  readonly Fhe: number;
  readonly Fic: number;
  readonly FS: number;
  readonly Fha: number;
  /** UG-28 elastic value: Do/t ≥ 10 2·A·E/(3·(Do/t)); Do/t < 10 Pa1 = [2.167/(Do/t) − 0.0833]·A·E/2. */
  readonly PaElastic: number;
  /** UG-28(c)(2) Do/t < 10 plastic limit 2S/(Do/t)·(1 − 1/(Do/t)), S = min(1.5·S, 0.9·Sy); null for Do/t ≥ 10. */
  readonly PaThick: number | null;
}

/** VIII-2 4.4.5.1 [from memory]: 2·Fha·(t/Do) and its intermediate values. */
function viii2(
  Do: number,
  t: number,
  L: number,
  Ey: number,
  Sy: number,
  out: { Mx: number; Ch: number; Fhe: number; Fic: number; FS: number; Fha: number } | null,
): number {
  const ratio = Do / t;
  // L capped at 50·Do like the chart, so an "infinitely long" cylinder stays finite.
  const Leff = Math.min(L, 50 * Do);
  const Mx = Leff / Math.sqrt((Do / 2) * t);
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
  if (out) {
    out.Mx = Mx;
    out.Ch = Ch;
    out.Fhe = Fhe;
    out.Fic = Fic;
    out.FS = FS;
    out.Fha = Fha;
  }
  return 2 * Fha * (t / Do);
}

/** UG-28 factor A, with UG-28(c)(2)'s A = 1.1/(Do/t)² for Do/t < 4 [from memory]. */
function factorAFor(Do: number, t: number, L: number): number {
  const ratio = Do / t;
  return ratio < 4 ? 1.1 / (ratio * ratio) : factorA(Do, t, L);
}

/** UG-28 elastic value [from memory]; Do/t < 10 the UG-28(c)(2) Pa1 with B = A·E/2. */
function ug28Elastic(ratio: number, A: number, Ey: number): number {
  return ratio >= 10 ? (2 * A * Ey) / (3 * ratio) : (2.167 / ratio - 0.0833) * ((A * Ey) / 2);
}

/** UG-28(c)(2) Pa2 for Do/t < 10 [from memory]; Infinity for Do/t ≥ 10. */
function ug28Thick(ratio: number, Sy: number, S: number): number {
  if (ratio >= 10) return Number.POSITIVE_INFINITY;
  const Sb = Math.min(1.5 * S, 0.9 * Sy);
  return ((2 * Sb) / ratio) * (1 - 1 / ratio);
}

/** Allowable external pressure only (no intermediate values): the function the wall solver calls. */
export function externalAllowablePressure(
  Do: number,
  t: number,
  L: number,
  Ey: number,
  Sy: number,
  S: number,
): number {
  const ratio = Do / t;
  const el = ug28Elastic(ratio, factorAFor(Do, t, L), Ey);
  const th = ug28Thick(ratio, Sy, S);
  const v2 = viii2(Do, t, L, Ey, Sy, null);
  return Math.min(el, th, v2);
}

/**
 * Allowable external pressure of a cylinder with effective wall t (after mill tolerance and
 * corrosion): the lower of the UG-28 value and the VIII-2 4.4.5.1 value, with which governs.
 */
export function externalAllowable(
  Do: number,
  t: number,
  L: number,
  Ey: number,
  Sy: number,
  S: number,
): ExternalAllowable {
  const ratio = Do / t;
  const A = factorAFor(Do, t, L);
  const parts = { Mx: 0, Ch: 0, Fhe: 0, Fic: 0, FS: 0, Fha: 0 };
  const PaVIII2 = viii2(Do, t, L, Ey, Sy, parts);
  const PaElastic = ug28Elastic(ratio, A, Ey);
  const thick = ug28Thick(ratio, Sy, S);
  const PaThick = ratio < 10 ? thick : null;
  const PaUg28 = Math.min(PaElastic, thick);
  const Pa = Math.min(PaUg28, PaVIII2);
  const basis: ExternalBasis =
    Pa === PaVIII2 && PaVIII2 < PaUg28
      ? 'viii2'
      : PaThick !== null && thick <= PaElastic
        ? 'ug28-thick'
        : 'ug28-elastic';
  return { Pa, basis, PaUg28, PaVIII2, A, ...parts, PaElastic, PaThick };
}

/**
 * Smallest effective wall t with allowable external pressure ≥ Pext (min of UG-28 and VIII-2).
 * Pa(t) rises with t; the solver brackets the root from the long-cylinder elastic estimate and
 * closes it by false position on ln Pa against ln t (Illinois variant): Pa is a power law of t
 * on each branch, so a few evaluations suffice. Converged to a relative 1e-12 of t.
 * Returns Do/2 when even a solid section would not hold (then the case fails).
 */
export function minimumExternalWall(
  Do: number,
  Pext: number,
  L: number,
  Ey: number,
  Sy: number,
  S: number,
): number {
  if (Pext <= 0) return 0;
  const tMax = Do / 2;
  if (!(externalAllowablePressure(Do, tMax, L, Ey, Sy, S) >= Pext)) return tMax;
  const lnP = Math.log(Pext);
  // Sides are decided by Pa ≥ Pext itself; ln Pa − ln P only steers the interpolation.
  const g = (t: number): number => {
    const pa = externalAllowablePressure(Do, t, L, Ey, Sy, S);
    const f = Math.log(pa) - lnP;
    return pa >= Pext ? Math.max(f, 0) : Math.min(f, -Number.MIN_VALUE);
  };
  // Long-cylinder elastic estimate: Pa = 2.2·E/(3·(Do/t)³).
  let tHi = Math.min(tMax, Do / Math.cbrt((2.2 * Ey) / (3 * Pext)));
  if (!(tHi > 0)) tHi = tMax;
  // Where that branch (UG-28 elastic, long cylinder, Do/t ≥ 10) is the lowest at its own root, the
  // root is the answer: below it that branch, and so the minimum, is under Pext.
  const r0 = Do / tHi;
  if (
    tHi < tMax &&
    r0 >= 10 &&
    factorA(Do, tHi, L) === 1.1 / (r0 * r0) &&
    ug28Elastic(r0, 1.1 / (r0 * r0), Ey) <= viii2(Do, tHi, L, Ey, Sy, null)
  ) {
    let t = tHi;
    for (let k = 0; k < 8 && externalAllowablePressure(Do, t, L, Ey, Sy, S) < Pext; k++)
      t *= 1 + 4e-16;
    if (externalAllowablePressure(Do, t, L, Ey, Sy, S) >= Pext) return t;
  }
  let fHi = g(tHi);
  let tLo = tHi;
  let fLo = fHi;
  if (fHi >= 0) {
    // Walk down until Pa < Pext.
    for (let k = 0; k < 200; k++) {
      tLo = tHi / 2;
      fLo = g(tLo);
      if (fLo < 0) break;
      tHi = tLo;
      fHi = fLo;
    }
    if (fLo >= 0) return tLo;
  } else {
    // Walk up until Pa ≥ Pext (tMax holds, so this ends).
    for (let k = 0; k < 200; k++) {
      tLo = tHi;
      fLo = fHi;
      tHi = Math.min(tMax, tHi * 2);
      fHi = g(tHi);
      if (fHi >= 0) break;
    }
  }
  // Illinois false position in x = ln t; keeps fLo < 0 ≤ fHi.
  let xLo = Math.log(tLo);
  let xHi = Math.log(tHi);
  let side = 0;
  for (let i = 0; i < 100 && xHi - xLo > 1e-12; i++) {
    let x = xHi - (fHi * (xHi - xLo)) / (fHi - fLo);
    if (!(x > xLo && x < xHi)) x = (xLo + xHi) / 2;
    const t = Math.exp(x);
    const f = g(t);
    if (f >= 0) {
      xHi = x;
      tHi = t;
      fHi = f;
      if (side === 1) fLo /= 2;
      side = 1;
    } else {
      xLo = x;
      fLo = f;
      if (side === -1) fHi /= 2;
      side = -1;
    }
  }
  return tHi;
}
