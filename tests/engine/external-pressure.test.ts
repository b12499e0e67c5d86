import { describe, expect, it } from 'vitest';
import type { SpoolDocument, SpoolElement } from '@shared/model/spool';
import {
  checkSpool,
  EXTERNAL_BASIS_LABEL,
  externalAllowable,
  externalAllowablePressure,
  factorA,
  minimumExternalWall,
} from '@shared/engine/index';

// B31.3 para. 304.1.3 sends external pressure to BPVC VIII-1 UG-28 [pub: the referral]. Every
// relation below is recalled FROM MEMORY (UG-28 factor A from geometry, UG-28(c)(1) elastic
// Pa = 4B/(3·Do/t) with B = A·E/2, UG-28(c)(2) for Do/t < 10, VIII-2 4.4.5.1 closed form):
// verify against the licensed editions. The check values are these relations evaluated by hand.

const E = 29e6;
const Sy = 35000;
const S = 20000;

describe('allowable = lower of UG-28 and VIII-2 4.4.5.1 (from memory)', () => {
  it('NPS 24 Sch 10, L = 1,200 in, E = 29e6 psi, c = 0, 12.5 % mill tolerance: UG-28 elastic 16.10 psi governs; VIII-2 alone gave 19.32 psi', () => {
    const t = 0.25 * 0.875; // B36.10M NPS 24 Sch 10 = 0.250 in, less 12.5 % (ASTM A530)
    const a = externalAllowable(24, t, 1200, E, Sy, S);
    // By hand: Do/t = 109.71, A = 1.1/(Do/t)² = 9.138e-5 (long cylinder, L/Do = 50), Pa = 2·A·E/(3·Do/t).
    expect(a.A).toBeCloseTo(1.1 / (24 / t) ** 2, 12);
    expect(a.PaUg28).toBeCloseTo(16.1, 2);
    expect(a.PaVIII2).toBeCloseTo(19.32, 2);
    expect(a.Pa).toBe(a.PaUg28);
    expect(a.basis).toBe('ug28-elastic');
  });

  it('the ordered wall for 14.7 psi on that pipe is ≈ 0.243 in (UG-28 elastic, by hand: Do/t = (2.2·E/(3·14.7))^(1/3) = 113.1; 24/113.1/0.875), not the 0.228 in of VIII-2 alone', () => {
    const doc: SpoolDocument = {
      units: 'imperial',
      conditions: {
        pressure: 0,
        temperature: 100,
        allowableStress: S,
        externalPressure: 14.7,
        stiffenedLength: 1200,
        elasticModulus: E,
        yieldStrength: Sy,
      },
      elements: [{ id: 'S1', kind: 'straight', nps: '24', schedule: '10', length: 100 }],
    };
    const e = checkSpool(doc).elements[0]!;
    const ext = e.cases.find((c) => c.case === 'external')!;
    const byHand = 24 / Math.cbrt((2.2 * E) / (3 * 14.7));
    expect(ext.t).toBeCloseTo(byHand, 6);
    expect(ext.requiredNominalWall).toBeCloseTo(0.243, 3);
    expect(ext.minimumWallBasis).toBe('ug28-elastic');
    // The chosen wall (Sch 10): both values and which governs are in the result and the trail.
    expect(ext.allowableUg28).toBeCloseTo(16.1, 2);
    expect(ext.allowableVIII2).toBeCloseTo(19.32, 2);
    expect(ext.allowablePressure).toBeCloseTo(16.1, 2);
    expect(ext.allowableBasis).toBe('ug28-elastic');
    const labels = ext.trail.map((s) => `${s.equation} ${s.label}`).join('\n');
    expect(labels).toContain('UG-28');
    expect(labels).toContain('VIII-2 4.4.5.1');
    expect(labels).toContain('governs');
    // Every recalled formula is labelled as such in the output.
    for (const s of ext.trail.filter((x) => /UG-28|VIII-2/.test(x.equation) && x.symbol !== 't_e'))
      expect(s.equation).toContain('from memory');
    const msg = e.messages.find((m) => m.code === 'external-allowable')!;
    expect(msg.text).toContain('UG-28');
    expect(msg.text).toContain('VIII-2');
    expect(msg.text).toContain('from memory');
    expect(EXTERNAL_BASIS_LABEL.viii2).toContain('from memory');
  });

  it('never above the UG-28 elastic value, at any Do/t ≥ 10 and length (the bound B31.3 cites; from memory)', () => {
    for (const ratio of [10, 20, 50, 100, 200, 400]) {
      for (const L of [24, 120, 600, 5000]) {
        const t = 24 / ratio;
        const a = externalAllowable(24, t, L, E, Sy, S);
        expect(a.Pa).toBeLessThanOrEqual((2 * factorA(24, t, L) * E) / (3 * ratio) + 1e-12);
        expect(a.Pa).toBeLessThanOrEqual(a.PaVIII2);
      }
    }
  });

  it('the VIII-2 value governs at the inelastic knee (short, thick cylinders), where the elastic line overstates strength (from memory)', () => {
    const a = externalAllowable(10, 0.8, 30, E, Sy, S); // Do/t = 12.5, L/Do = 3
    expect(a.PaVIII2).toBeLessThan(a.PaUg28);
    expect(a.basis).toBe('viii2');
  });

  it('Do/t < 10 keeps the UG-28(c)(2) limit Pa2 = 2S/(Do/t)·(1 − 1/(Do/t)), S = min(1.5·S, 0.9·Sy) (from memory)', () => {
    const t = 1; // Do/t = 6; a low S (5,000 psi) so the plastic limit is the lowest
    const a = externalAllowable(6, t, 60, E, Sy, 5000);
    const Sb = Math.min(1.5 * 5000, 0.9 * Sy);
    expect(a.PaThick).toBeCloseTo(((2 * Sb) / 6) * (1 - 1 / 6), 9);
    expect(a.Pa).toBeLessThanOrEqual(a.PaThick!);
    expect(a.basis).toBe('ug28-thick');
    // Do/t < 4: A = 1.1/(Do/t)² (UG-28(c)(2)).
    expect(externalAllowable(3, 1, 60, E, Sy, S).A).toBeCloseTo(1.1 / 9, 12);
  });

  it('the minimum-wall solver lands on the boundary: Pa(t) ≥ P and Pa(t·(1 − 1e-9)) < P, across the branches', () => {
    for (const [Do, P, L] of [
      [24, 14.7, 1200],
      [4.5, 14.7, 240],
      [12.75, 200, 60],
      [6.625, 3000, 100],
      [48, 5, 96],
      [2.375, 1500, 1000],
    ] as const) {
      const t = minimumExternalWall(Do, P, L, E, Sy, S);
      expect(externalAllowablePressure(Do, t, L, E, Sy, S)).toBeGreaterThanOrEqual(P);
      expect(externalAllowablePressure(Do, t * (1 - 1e-9), L, E, Sy, S)).toBeLessThan(P);
    }
    expect(minimumExternalWall(4.5, 1e9, 100, E, Sy, S)).toBe(4.5 / 2);
    expect(minimumExternalWall(4.5, 0, 100, E, Sy, S)).toBe(0);
  });
});

const el: SpoolElement = { id: 'S1', kind: 'straight', nps: '12', schedule: '10', length: 100 };
it('metric documents give the same external wall as imperial ones (UG-28/VIII-2 are dimensionally consistent; from memory)', () => {
  const imp = checkSpool({
    units: 'imperial',
    conditions: {
      pressure: 0,
      temperature: 100,
      allowableStress: 20000,
      externalPressure: 14.7,
      stiffenedLength: 240,
      elasticModulus: 29e6,
      yieldStrength: 35000,
    },
    elements: [{ ...el, outsideDiameter: 12.75, nominalWall: 0.18 }],
  }).elements[0]!;
  const k = 6894.757293168 / 1e6;
  const met = checkSpool({
    units: 'metric',
    conditions: {
      pressure: 0,
      temperature: 37.7778,
      allowableStress: 20000 * k,
      externalPressure: 14.7 * k,
      stiffenedLength: 240 * 25.4,
      elasticModulus: 29e6 * k,
      yieldStrength: 35000 * k,
    },
    elements: [{ ...el, outsideDiameter: 12.75 * 25.4, nominalWall: 0.18 * 25.4 }],
  }).elements[0]!;
  const a = imp.cases.find((c) => c.case === 'external')!;
  const b = met.cases.find((c) => c.case === 'external')!;
  expect(b.t / 25.4).toBeCloseTo(a.t, 9);
  expect(b.allowablePressure! / k).toBeCloseTo(a.allowablePressure!, 6);
});
