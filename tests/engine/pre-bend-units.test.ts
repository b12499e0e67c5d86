import { describe, expect, it } from 'vitest';
import type { SpoolDocument, SpoolElement } from '@shared/model/spool';
import { checkSpool, type ElementCheck } from '@shared/engine/index';
import { preBendFactor, preBendFactorValue, PRE_BEND_TABLE } from '@shared/data/code-tables';
import { getPipeWall } from '@shared/data/pipe-dimensions';
import { PSI_PER_MPA } from '@shared/units/units';

// Source: ASME B31.1 Table 102.4.5 (minimum thickness before bending: 6D or greater 1.06 tm,
// 5D 1.08, 4D 1.14, 3D 1.25; straight-line interpolation). A bend keeps its row whatever the
// document's units: R1/NPS computed in millimetres (3 × 203.2 / 203.2 = 2.9999999999999996)
// must not fall off the 3D row.

const rows: [number, number][] = [
  [3, 1.25],
  [4, 1.14],
  [5, 1.08],
  [6, 1.06],
  [8, 1.06],
];

function bendCheck(
  units: 'imperial' | 'metric',
  radius: 'multiple' | 'length',
  n: number,
): ElementCheck {
  const psi = 300;
  const S = 20000;
  const nps = '8';
  const R1in = n * 8;
  const bend: SpoolElement = {
    id: 'B1',
    kind: 'bend',
    nps,
    schedule: '40',
    angle: 90,
    bendRadius:
      radius === 'multiple' ? { multipleOfD: n } : units === 'metric' ? R1in * 25.4 : R1in,
  };
  const conditions: SpoolDocument['conditions'] =
    units === 'imperial'
      ? {
          pressure: psi,
          temperature: 100,
          allowableStress: S,
          qualityFactor: 1,
          weldStrengthFactor: 1,
          coefficientY: 0.4,
        }
      : {
          pressure: psi / PSI_PER_MPA,
          temperature: 37.7778,
          allowableStress: S / PSI_PER_MPA,
          qualityFactor: 1,
          weldStrengthFactor: 1,
          coefficientY: 0.4,
        };
  const e = checkSpool({ units, conditions, elements: [bend] }).elements[0];
  if (!e?.preBend) throw new Error('no pre-bend result');
  return e;
}

describe('B31.1 Table 102.4.5 factor in both unit systems', () => {
  it.each(rows)(
    '%sD → factor %s, the same in imperial and metric, radius given as nD or as a length',
    (n, factor) => {
      const odRatio =
        (getPipeWall('8', '40')?.odMm ?? 0) / ((getPipeWall('8', '40')?.odIn ?? 0) * 25.4); // 219.1 / 219.075 (B36.10M metric column)
      const imp = bendCheck('imperial', 'multiple', n);
      for (const e of [
        imp,
        bendCheck('imperial', 'length', n),
        bendCheck('metric', 'multiple', n),
        bendCheck('metric', 'length', n),
      ]) {
        expect(e.preBend?.tableFactor).toBe(factor);
      }
      for (const radius of ['multiple', 'length'] as const) {
        const met = bendCheck('metric', radius, n);
        // Same wall, converted: equal to within the standard's rounding of the metric OD (0.011 %).
        const relTable = met.preBend!.tableWall! / 25.4 / imp.preBend!.tableWall! - 1;
        expect(Math.abs(relTable - (odRatio - 1))).toBeLessThan(1e-6);
        const relOrdered =
          met.preBend!.requiredOrderedWall / 25.4 / imp.preBend!.requiredOrderedWall - 1;
        expect(Math.abs(relOrdered)).toBeLessThan(2e-4);
      }
    },
  );

  it('the issue case: metric NPS 8 3D bend before-bending wall is 1.25·tm, not the geometric 1.722 mm (imperial gives 1.974 mm-equivalent)', () => {
    const met = bendCheck('metric', 'multiple', 3);
    expect(met.preBend?.tableFactor).toBe(1.25);
    expect(met.preBend!.tableWall!).toBeGreaterThan(met.preBend!.geometricWall);
    expect(met.messages.some((m) => m.code === 'pre-bend-table')).toBe(false);
  });

  it('ratios within 1e-9 of a row read that row; a bend truly under 3D stays off the table', () => {
    expect(preBendFactor(2.9999999999999996).value).toBe(1.25);
    expect(preBendFactor(3.0000000000000004).value).toBe(1.25);
    expect(preBendFactorValue(2.9999999999999996)).toBe(1.25);
    expect(preBendFactor(2.99).value).toBeNull();
    expect(preBendFactorValue(2.99)).toBeNull();
    // Interpolation between rows is unchanged (straight-line, B31.1 Table 102.4.5 note).
    expect(preBendFactorValue(3.5)).toBeCloseTo((1.25 + 1.14) / 2, 12);
    for (let x = 2.5; x < 8; x += 0.0625)
      expect(preBendFactorValue(x)).toBe(preBendFactor(x).value);
    expect(PRE_BEND_TABLE.map((p) => p.x)).toEqual([3, 4, 5, 6]);
  });
});
