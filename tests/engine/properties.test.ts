import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseSpoolDocument, type SpoolDocument } from '@shared/model/spool';
import {
  checkSpool,
  extradosFactor,
  intradosFactor,
  straightThickness,
} from '@shared/engine/index';
import { NPS_SIZES, SCHEDULES } from '@shared/data/pipe-dimensions';
import { MATERIALS } from '@shared/data/materials';
import { runCheck } from '@shared/cli/check';

// Property tests: general laws of the equations (monotonicity, limits) — no tabulated check values.
const pos = (min: number, max: number) =>
  fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

describe('equation properties', () => {
  it('Eq. (3a): t rises with pressure and falls with allowable stress', () => {
    fc.assert(
      fc.property(
        pos(1, 5000),
        pos(1, 5000),
        pos(0.5, 60),
        pos(5000, 40000),
        pos(0.6, 1),
        pos(0, 0.7),
        (p1, p2, D, S, E, Y) => {
          const [lo, hi] = p1 < p2 ? [p1, p2] : [p2, p1];
          fc.pre(hi - lo > 1e-6);
          expect(straightThickness(hi, D, S, E, 1, Y)).toBeGreaterThan(
            straightThickness(lo, D, S, E, 1, Y),
          );
          expect(straightThickness(lo, D, S * 1.1, E, 1, Y)).toBeLessThan(
            straightThickness(lo, D, S, E, 1, Y),
          );
        },
      ),
    );
  });
  it('intrados I > 1 > extrados I for every R1/D > 0.5, and both → 1 as R1/D grows', () => {
    fc.assert(
      fc.property(pos(0.5001, 1000), (r) => {
        expect(intradosFactor(r)).toBeGreaterThan(1);
        expect(extradosFactor(r)).toBeLessThan(1);
        expect(intradosFactor(r * 2) - 1).toBeLessThan(intradosFactor(r) - 1);
        expect(1 - extradosFactor(r * 2)).toBeLessThan(1 - extradosFactor(r));
      }),
    );
    expect(intradosFactor(1e6)).toBeCloseTo(1, 5);
    expect(extradosFactor(1e6)).toBeCloseTo(1, 5);
  });
});

const npsArb = fc.constantFrom(...NPS_SIZES);
const scheduleArb = fc.constantFrom(...SCHEDULES);
const materialArb = fc.constantFrom(...MATERIALS.map((m) => m.id));

const elementArb = fc.oneof(
  fc.record({
    kind: fc.constant('straight' as const),
    nps: npsArb,
    schedule: scheduleArb,
    length: pos(0.1, 1000),
    endType: fc.constantFrom('plain', 'bevel', 'threaded', 'grooved', undefined),
  }),
  fc.record({
    kind: fc.constant('bend' as const),
    nps: npsArb,
    schedule: scheduleArb,
    bendRadius: fc.oneof(pos(0.1, 500), fc.record({ multipleOfD: pos(0.2, 20) })),
    angle: pos(1, 180),
  }),
);

const docArb = fc
  .record({
    units: fc.constantFrom('imperial' as const, 'metric' as const),
    conditions: fc.record(
      {
        pressure: pos(0, 20000),
        temperature: pos(-100, 1300),
        externalPressure: pos(0, 200),
        material: materialArb,
        productForm: fc.constantFrom(
          'seamless',
          'erw',
          'efw-single',
          'efw-double',
          'efw-spot-rt',
          'efw-full-rt',
          'furnace-butt',
        ),
        corrosionAllowance: pos(0, 0.3),
        millTolerance: pos(0, 0.3),
        stiffenedLength: pos(1, 5000),
        grooveDepth: pos(0, 0.2),
      },
      { requiredKeys: ['pressure', 'temperature', 'material'] },
    ),
    elements: fc.array(elementArb, { minLength: 1, maxLength: 6 }),
  })
  .map((d) => ({ ...d, elements: d.elements.map((e, i) => ({ ...e, id: `E${i}` })) }));

describe('engine robustness', () => {
  it('no document the schema accepts crashes the engine; results are finite', () => {
    fc.assert(
      fc.property(docArb, (raw) => {
        const parsed = parseSpoolDocument(raw);
        if (!parsed.ok) return;
        const check = checkSpool(parsed.doc);
        expect(check.elements).toHaveLength(parsed.doc.elements.length);
        for (const e of check.elements) {
          if (e.status === 'invalid') {
            expect(e.inputIssues.length).toBeGreaterThan(0);
            continue;
          }
          for (const v of [e.outsideDiameter, e.nominalWall, e.minimumWall, e.mawp])
            expect(Number.isFinite(v)).toBe(true);
          for (const c of e.cases) {
            expect(Number.isFinite(c.tm) || e.status === 'review').toBe(true);
            expect(c.trail.length).toBeGreaterThan(0);
          }
          expect(JSON.parse(JSON.stringify(e)).id).toBe(e.id);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('required wall rises with pressure for the same element (straights and bends)', () => {
    fc.assert(
      fc.property(npsArb, pos(10, 2000), fc.boolean(), (nps, p, bend) => {
        const el = bend
          ? {
              id: 'a',
              kind: 'bend' as const,
              nps,
              schedule: 'XXS',
              bendRadius: { multipleOfD: 5 },
              angle: 90,
            }
          : { id: 'a', kind: 'straight' as const, nps, schedule: 'XXS', length: 10 };
        const mk = (pressure: number): SpoolDocument => ({
          units: 'imperial',
          conditions: { pressure, temperature: 100, material: 'A106-B' },
          elements: [el],
        });
        const a = checkSpool(mk(p)).elements[0];
        const b = checkSpool(mk(p * 1.5)).elements[0];
        if (!a || !b || a.status === 'invalid' || b.status === 'invalid') return;
        expect(b.requiredNominalWall).toBeGreaterThan(a.requiredNominalWall);
      }),
    );
  });
});

describe('bad input always gives exit 2 and a field path', () => {
  const good = {
    units: 'imperial',
    conditions: { pressure: 150, temperature: 200, material: 'A106-B' },
    elements: [
      { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 50 },
      {
        id: 'B1',
        kind: 'bend',
        nps: '4',
        schedule: '40',
        bendRadius: { multipleOfD: 3 },
        angle: 90,
      },
    ],
  };
  const corruptions: [string, (d: typeof good) => unknown][] = [
    ['units', (d) => ({ ...d, units: 'furlongs' })],
    ['conditions.pressure', (d) => ({ ...d, conditions: { ...d.conditions, pressure: -1 } })],
    [
      'conditions.temperature',
      (d) => ({ ...d, conditions: { ...d.conditions, temperature: 'hot' } }),
    ],
    ['conditions.material', (d) => ({ ...d, conditions: { ...d.conditions, material: 'cheese' } })],
    [
      'conditions.millTolerance',
      (d) => ({ ...d, conditions: { ...d.conditions, millTolerance: 1.5 } }),
    ],
    [
      'elements[0].length',
      (d) => ({ ...d, elements: [{ ...d.elements[0], length: 0 }, d.elements[1]] }),
    ],
    [
      'elements[0].nps',
      (d) => ({ ...d, elements: [{ ...d.elements[0], nps: '7' }, d.elements[1]] }),
    ],
    [
      'elements[1].schedule',
      (d) => ({ ...d, elements: [d.elements[0], { ...d.elements[1], schedule: 'XXXS' }] }),
    ],
    [
      'elements[1].bendRadius',
      (d) => ({
        ...d,
        elements: [d.elements[0], { ...d.elements[1], bendRadius: { multipleOfD: 0.25 } }],
      }),
    ],
    [
      'elements[1].angle',
      (d) => ({ ...d, elements: [d.elements[0], { ...d.elements[1], angle: 270 }] }),
    ],
    [
      'elements[1].id',
      (d) => ({ ...d, elements: [d.elements[0], { ...d.elements[1], id: 'S1' }] }),
    ],
  ];
  it.each(corruptions)('%s', (path, corrupt) => {
    const r = runCheck(['--json', 'doc.json'], () => JSON.stringify(corrupt(good)));
    expect(r.code).toBe(2);
    const out = JSON.parse(r.stdout) as { error: { details: { path: string }[] } };
    expect(out.error.details.map((d) => d.path)).toContain(path);
    expect(r.stderr).toContain(path);
  });
  it('random corruption of a field gives exit 2 with a path under elements or conditions', () => {
    const fields = [
      'pressure',
      'temperature',
      'corrosionAllowance',
      'millTolerance',
      'externalPressure',
    ] as const;
    fc.assert(
      fc.property(
        fc.constantFrom(...fields),
        fc.oneof(
          fc.constant(-5),
          fc.constant('x'),
          fc.constant(null),
          fc.constant(true),
          fc.constant({}),
        ),
        (field, value) => {
          // −5 is a valid temperature (°F), so it only corrupts the non-negative fields.
          fc.pre(!(field === 'temperature' && value === -5));
          const doc = { ...good, conditions: { ...good.conditions, [field]: value } };
          const text = JSON.stringify(doc);
          const r = runCheck(['--json', 'doc.json'], () => text);
          expect(r.code).toBe(2);
          const out = JSON.parse(r.stdout) as { error: { details: { path: string }[] } };
          expect(out.error.details.some((d) => d.path === `conditions.${field}`)).toBe(true);
        },
      ),
    );
  });
});
