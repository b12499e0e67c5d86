import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseSpoolDocument, type SpoolDocument } from '@shared/model/spool';
import {
  checkSpool,
  checkSpoolFigures,
  createSpoolChecker,
  explainElement,
  figuresOf,
  visitSpoolFigures,
  type ElementFigures,
} from '@shared/engine/index';
import { NPS_SIZES, SCHEDULES } from '@shared/data/pipe-dimensions';
import { MATERIALS } from '@shared/data/materials';

// Property: the numbers-first path (no trail, no text) and the trail path give identical numbers,
// statuses, schedule choices and message codes on random documents. No check values here.

const pos = (min: number, max: number) =>
  fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
const materialArb = fc.constantFrom(...MATERIALS.map((m) => m.id));
const overridesArb = fc.record(
  {
    pressure: pos(0, 6000),
    temperature: pos(-50, 1100),
    material: materialArb,
    allowableStress: pos(5000, 30000),
    externalPressure: pos(0, 100),
    corrosionAllowance: pos(0, 0.2),
    millTolerance: pos(0, 0.2),
    millToleranceLength: pos(0, 0.05),
    coefficientY: pos(0, 0.7),
    stiffenedLength: pos(1, 3000),
    elasticModulus: pos(20e6, 31e6),
    yieldStrength: pos(20000, 80000),
  },
  { requiredKeys: [] },
);
const sized = fc.oneof(
  fc.record({ nps: fc.constantFrom(...NPS_SIZES), schedule: fc.constantFrom(...SCHEDULES) }),
  fc.record({ outsideDiameter: pos(0.5, 60), nominalWall: pos(0.02, 2) }),
  fc.record({ nps: fc.constantFrom(...NPS_SIZES), nominalWall: pos(0.02, 2) }),
);
const elementArb = fc.tuple(
  sized,
  fc.oneof(
    fc.record({
      kind: fc.constant('straight' as const),
      length: pos(0.1, 500),
      endType: fc.constantFrom('plain', 'bevel', 'threaded', 'grooved', undefined),
    }),
    fc.record({
      kind: fc.constant('bend' as const),
      bendRadius: fc.oneof(pos(0.5, 400), fc.record({ multipleOfD: pos(0.6, 12) })),
      angle: pos(1, 180),
    }),
  ),
  fc.option(overridesArb, { nil: undefined }),
);
const docArb = fc
  .record({
    units: fc.constantFrom('imperial' as const, 'metric' as const),
    conditions: fc.record(
      {
        pressure: pos(0, 6000),
        temperature: pos(-50, 1100),
        externalPressure: pos(0, 100),
        material: materialArb,
        allowableStress: pos(5000, 30000),
        productForm: fc.constantFrom(
          'seamless',
          'erw',
          'efw-single',
          'efw-full-rt',
          'furnace-butt',
        ),
        corrosionAllowance: pos(0, 0.2),
        millTolerance: pos(0, 0.2),
        stiffenedLength: pos(1, 3000),
        grooveDepth: pos(0, 0.1),
      },
      { requiredKeys: ['pressure', 'temperature', 'material'] },
    ),
    elements: fc.array(elementArb, { minLength: 1, maxLength: 8 }),
  })
  .map((d) => ({
    ...d,
    elements: d.elements.map(([size, shape, conditions], i) => ({
      id: `E${i}`,
      ...size,
      ...shape,
      ...(conditions ? { conditions } : {}),
    })),
  }));

function parsed(raw: unknown): SpoolDocument | null {
  const p = parseSpoolDocument(raw);
  return p.ok ? p.doc : null;
}

describe('numbers-first path = trail path', () => {
  it('identical figures on 400 random documents (both unit systems, overrides, external pressure, explicit walls)', () => {
    let compared = 0;
    fc.assert(
      fc.property(docArb, (raw) => {
        const doc = parsed(raw);
        if (!doc) return;
        const full = checkSpool(doc);
        const fast = checkSpoolFigures(doc);
        expect(fast.elements).toEqual(full.elements.map(figuresOf));
        expect(fast.summary).toEqual(full.summary);
        expect(fast.worst).toBe(full.worst);
        const streamed: ElementFigures[] = [];
        const s = visitSpoolFigures(doc, (f) => streamed.push(f));
        expect(streamed).toEqual(fast.elements);
        expect(s.summary).toEqual(full.summary);
        compared += doc.elements.length;
      }),
      { numRuns: 400 },
    );
    expect(compared).toBeGreaterThan(400);
  });

  it('the comparison can fail: a changed number is seen', () => {
    const doc: SpoolDocument = {
      units: 'imperial',
      conditions: { pressure: 300, temperature: 100, material: 'A106-B' },
      elements: [{ id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 10 }],
    };
    const fast = checkSpoolFigures(doc).elements[0]!;
    const full = figuresOf(checkSpool(doc).elements[0]!);
    expect(fast).toEqual(full);
    expect({ ...fast, mawp: fast.mawp * (1 + 1e-15) }).not.toEqual(full);
  });

  it('the trail is built only on the trail path; explainElement returns it for one element', () => {
    const doc: SpoolDocument = {
      units: 'imperial',
      conditions: { pressure: 300, temperature: 100, material: 'A106-B', externalPressure: 14.7 },
      elements: [
        { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 10 },
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
    const fast = checkSpoolFigures(doc);
    for (const e of fast.elements) {
      for (const c of e.cases) expect('trail' in c).toBe(false);
      expect('inputs' in e).toBe(false);
      expect('messages' in e).toBe(false);
    }
    const b = explainElement(doc, 'B1');
    expect(b?.cases.every((c) => c.trail.length > 0)).toBe(true);
    expect(b?.preBend?.trail.length).toBeGreaterThan(0);
    expect(b?.inputs.length).toBeGreaterThan(0);
    expect(b).toEqual(checkSpool(doc).elements[1]);
    expect(explainElement(doc, 'nope')).toBeNull();
  });

  it('the memoising checker stays equal to checkSpool across edits, inserts, deletes and condition changes (random)', () => {
    fc.assert(
      fc.property(docArb, fc.array(fc.nat(20), { minLength: 1, maxLength: 6 }), (raw, ops) => {
        const doc = parsed(raw);
        if (!doc) return;
        const checker = createSpoolChecker();
        let cur = doc;
        expect(checker(cur)).toEqual(checkSpool(cur));
        for (const op of ops) {
          const els = cur.elements.slice();
          const i = op % els.length;
          const el = els[i]!;
          if (op % 4 === 0) els[i] = { ...el };
          else if (op % 4 === 1) els.splice(i, 0, { ...el, id: `${el.id}x${op}` });
          else if (op % 4 === 2 && els.length > 1) els.splice(i, 1);
          else
            cur = {
              ...cur,
              conditions: { ...cur.conditions, pressure: cur.conditions.pressure + 1 },
            };
          cur = { ...cur, elements: els };
          expect(checker(cur)).toEqual(checkSpool(cur));
        }
      }),
      { numRuns: 60 },
    );
  });
});
