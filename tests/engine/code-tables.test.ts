import { describe, expect, it } from 'vitest';
import { PRODUCT_FORMS } from '../../shared/model/spool';
import {
  GROOVE_TOLERANCE_IN,
  GROOVE_TOLERANCE_SOURCE,
  MILL_TOLERANCE_DEFAULT,
  PLATE_UNDER_TOLERANCE_IN,
  coefficientY,
  geometricThinning,
  preBendFactor,
  qualityFactorE,
  threadDepth,
  weldStrengthFactorW,
} from '../../shared/data/code-tables';
import type { WFamily, YFamily } from '../../shared/data/materials';

describe('coefficient Y, B31.3 Table 304.1.1', () => {
  it.each([
    ['ferritic', 70, 0.4], // ≤900 °F column
    ['ferritic', 900, 0.4], // Table 304.1.1
    ['ferritic', 950, 0.5], // Table 304.1.1
    ['ferritic', 975, 0.6], // straight-line interpolation, permitted by Table 304.1.1
    ['ferritic', 1000, 0.7], // Table 304.1.1
    ['ferritic', 1400, 0.7], // ≥1250 °F column
    ['austenitic', 1050, 0.4], // Table 304.1.1
    ['austenitic', 1100, 0.5], // Table 304.1.1
    ['austenitic', 1125, 0.6], // interpolated 1100–1150 °F
    ['austenitic', 1150, 0.7], // Table 304.1.1
    ['nickel', 1150, 0.4], // Table 304.1.1, N06617/N08800/N08810/N08825
    ['nickel', 1200, 0.5], // Table 304.1.1
    ['nickel', 1250, 0.7], // Table 304.1.1
    ['gray-iron', 500, 0], // Table 304.1.1, gray iron
    ['other', 1300, 0.4], // Table 304.1.1, other ductile metals
  ] as const)('%s at %d °F = %d', (family, tempF, y) => {
    const r = coefficientY(family as YFamily, tempF);
    expect(r.value).toBeCloseTo(y, 10);
    expect(r.source).toContain('Table 304.1.1');
  });
});

describe('quality factor E, B31.3 Table A-1B', () => {
  it.each([
    ['seamless', 1.0], // Table A-1B
    ['furnace-butt', 0.6], // Table A-1B
    ['erw', 0.85], // Table A-1B (extra examination does not raise it)
    ['efw-single', 0.8], // Table A-1B
    ['efw-double', 0.85], // Table A-1B
    ['efw-spot-rt', 0.9], // Table A-1B
    ['efw-full-rt', 1.0], // Table A-1B
  ] as const)('%s = %d', (form, e) => {
    const r = qualityFactorE(form);
    expect(r.value).toBe(e);
    expect(r.source).toContain('Table A-1B');
  });
  it('covers every product form of the model', () => {
    for (const f of PRODUCT_FORMS) expect(qualityFactorE(f).value).toBeGreaterThan(0);
  });
});

describe('weld joint strength reduction factor W, B31.3 Table 302.3.5 (2014/2016)', () => {
  it.each([
    ['cr-mo', 'erw', 700, 1], // below the tabulated temperatures
    ['cr-mo', 'erw', 800, 1], // Table 302.3.5, CrMo
    ['cr-mo', 'efw-double', 1000, 0.82], // Table 302.3.5, CrMo
    ['cr-mo', 'efw-double', 975, 0.84], // interpolated 950 (0.86) – 1000 (0.82)
    ['cr-mo', 'efw-double', 1200, 0.64], // Table 302.3.5, CrMo, last column
    ['austenitic', 'efw-single', 900, 1], // below the austenitic row
    ['austenitic', 'efw-single', 1200, 0.77], // Table 302.3.5, austenitic 3xx
    ['austenitic', 'efw-single', 1500, 0.5], // Table 302.3.5, austenitic 3xx
    ['nickel', 'efw-full-rt', 1100, 0.86], // Table 302.3.5, N088xx share the austenitic row
    ['carbon', 'erw', 700, 1], // below the tabulated temperatures
    ['cr-mo', 'seamless', 1200, 1], // seamless pipe: W = 1.0 (para. 302.3.5)
    ['austenitic', 'seamless', 1500, 1], // seamless pipe: W = 1.0 (para. 302.3.5)
    ['none', 'erw', 1200, 1], // no reduction family
  ] as const)('%s %s at %d °F = %d', (family, form, tempF, w) => {
    const r = weldStrengthFactorW(family as WFamily, form, tempF);
    expect(r.value).toBeCloseTo(w, 10);
    expect(r.source).toMatch(/302\.3\.5/);
    expect(r.rule.length).toBeGreaterThan(0);
  });

  it('holds the last value above the table and says so in rule', () => {
    const r = weldStrengthFactorW('cr-mo', 'erw', 1250); // CrMo row ends at 1200 °F
    expect(r.value).toBe(0.64);
    expect(r.rule).toContain('above 1200 °F');
  });

  it('flags carbon steel and CSEF above 800 °F: no row of the table is embedded', () => {
    const cs = weldStrengthFactorW('carbon', 'erw', 1000);
    expect(cs.rule).toContain('not embedded');
    expect(cs.value).toBeCloseTo(1 - 0.5 * (50 / 550), 10); // older-edition linear rule at 1000 °F
    expect(weldStrengthFactorW('csef', 'efw-full-rt', 1100).rule).toContain('CSEF');
  });

  it.each([
    [900, 1], // older editions: 1.0 at and below 950 °F
    [950, 1], // older editions
    [1225, 0.75], // linear 1.0 at 950 °F → 0.5 at 1500 °F, midpoint
    [1500, 0.5], // older editions
  ] as const)('linear-legacy at %d °F = %d', (tempF, w) => {
    const r = weldStrengthFactorW('austenitic', 'efw-double', tempF, 'linear-legacy');
    expect(r.value).toBeCloseTo(w, 10);
    expect(r.rule).toContain('linear-legacy');
  });
});

describe('thread depth, ASME B1.20.1 h = 0.8p', () => {
  it.each([
    [0.125, 27, 0.02963], // B1.20.1, NPS 1/8
    [0.25, 18, 0.04444], // B1.20.1, NPS 1/4
    [0.375, 18, 0.04444], // B1.20.1, NPS 3/8
    [0.5, 14, 0.05714], // B1.20.1, NPS 1/2
    [0.75, 14, 0.05714], // B1.20.1, NPS 3/4
    [1, 11.5, 0.06957], // B1.20.1, NPS 1
    [1.5, 11.5, 0.06957], // B1.20.1, NPS 1-1/2
    [2, 11.5, 0.06957], // B1.20.1, NPS 2
    [2.5, 8, 0.1], // B1.20.1, NPS 2-1/2
    [3, 8, 0.1], // B1.20.1, NPS 3
    [12, 8, 0.1], // B1.20.1, NPS 12
  ])('NPS %d: %d threads/in, h = %d in', (nps, tpi, h) => {
    const r = threadDepth(nps);
    expect(r.threadsPerInch).toBe(tpi);
    expect(r.inches).toBeCloseTo(h, 5);
    expect(r.inches).toBeCloseTo(0.8 / tpi, 4); // h = 0.8p
    expect(r.source).toContain('B1.20.1');
  });
  it('throws RangeError on a non-positive NPS', () => {
    expect(() => threadDepth(0)).toThrow(RangeError);
  });
});

describe('constants', () => {
  it('groove tolerance 0.02 in is from memory', () => {
    expect(GROOVE_TOLERANCE_IN).toBe(0.02); // groove depth + 0.5 mm, from memory
    expect(GROOVE_TOLERANCE_SOURCE).toContain('from memory, verify against the licensed edition');
  });
  it('mill tolerance 12.5 % and A358 plate under-tolerance 0.01 in', () => {
    expect(MILL_TOLERANCE_DEFAULT).toBe(0.125); // ASTM A530/A999
    expect(PLATE_UNDER_TOLERANCE_IN).toBe(0.01); // ASTM A358
  });
});

describe('thickness before bending, B31.1 Table 102.4.5', () => {
  it.each([
    [3, 1.25], // Table 102.4.5, 3D
    [3.5, 1.195], // interpolated 3D–4D (interpolation allowed)
    [4, 1.14], // Table 102.4.5, 4D
    [5, 1.08], // Table 102.4.5, 5D
    [5.5, 1.07], // interpolated 5D–6D
    [6, 1.06], // Table 102.4.5, 6D or greater
    [10, 1.06], // Table 102.4.5, 6D or greater
  ])('%dD → %d', (ratio, factor) => {
    const r = preBendFactor(ratio);
    expect(r.value).not.toBeNull();
    expect(r.value!).toBeCloseTo(factor, 10);
    expect(r.source).toContain('Table 102.4.5');
  });
  it('gives null below 3D with a note', () => {
    const r = preBendFactor(2.5);
    expect(r.value).toBeNull();
    expect(r.note).toContain('below table range');
  });
});

describe('geometric bend thinning (common practice)', () => {
  it.each([
    [3, 14.3], // common practice [trade]: 14.3 % at 3D
    [4, 11.1], // common practice [trade]: 11.1 % at 4D
    [5, 9.1], // common practice [trade]: 9.1 % at 5D
    [6, 7.7], // common practice [trade]: 7.7 % at 6D
  ])('%dD: extrados thinning %d %%', (ratio, pct) => {
    const r = geometricThinning(ratio);
    expect((1 - r.extrados) * 100).toBeCloseTo(pct, 1);
    expect(r.intrados).toBeCloseTo((2 * ratio) / (2 * ratio - 1), 12);
    expect(r.source).toContain('common practice');
  });
  it('3D intrados thickens by 20 % (t·6/5, same geometric estimate)', () => {
    expect(geometricThinning(3).intrados).toBeCloseTo(1.2, 12);
  });
  it('throws RangeError at R/D ≤ 0.5', () => {
    expect(() => geometricThinning(0.5)).toThrow(RangeError);
  });
});
