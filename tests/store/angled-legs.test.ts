import { describe, expect, it } from 'vitest';
import { isBend, isStraight, parseSpoolDocument, type SpoolDocument } from '@shared/model/spool';
import { angledDirection } from '@/features/sketch/geometry/angled-direction';
import { createSpoolStore } from '@/features/sketch/store/spool-store';

// NPS 2 pipe, default bend radius 3D = 3 × NPS = 6 in (common practice "nD" = n × NPS).
// A bend of θ takes R·tan(θ/2) of tangent from each leg it joins (geometry of two tangent
// lines to a circle): 45° → 6·tan(22.5°) = 2.485281 in; 30° → 6·tan(15°) = 1.607695 in.
const R = 6;
const T45 = R * Math.tan(Math.PI / 8);
const T30 = R * Math.tan(Math.PI / 12);

const doc = (): SpoolDocument => ({
  units: 'imperial',
  name: 'Angled legs',
  conditions: { pressure: 300, temperature: 200, material: 'A106-B' },
  defaultBendRadius: { multipleOfD: 3 },
  elements: [],
});

const fresh = () => {
  const store = createSpoolStore(doc());
  store.getState().startRun({ nps: '2', schedule: '40' }, { history: 'never' });
  return store;
};

const heading = (input: Parameters<typeof angledDirection>[0]) => {
  const r = angledDirection(input);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.heading;
};
const NE45 = () => heading({ from: 'east', toward: 'north', angle: 45 });

describe('angled legs', () => {
  it('draws a 45° offset: two 45° bends, cut lengths less R·tan(22.5°) per bend', () => {
    const store = fresh();
    const s = store.getState();
    expect(s.addLeg('east', 100)).toEqual({ ok: true });
    expect(s.addLeg(NE45(), 50)).toEqual({ ok: true });
    expect(s.addLeg('east', 100)).toEqual({ ok: true });
    const els = store.getState().doc.elements;
    expect(els.map((e) => e.kind)).toEqual(['straight', 'bend', 'straight', 'bend', 'straight']);
    const bends = els.filter(isBend);
    expect(bends.map((b) => b.angle)).toEqual([45, 45]);
    const [s1, s2, s3] = els.filter(isStraight);
    expect(s1!.length).toBeCloseTo(100 - T45, 5); // 97.514719
    expect(s2!.length).toBeCloseTo(50 - 2 * T45, 5); // 45.029437
    expect(s3!.length).toBeCloseTo(100 - T45, 5);
    // The angled leg and the bend into it carry the general heading; axis legs keep axis names.
    expect(s2!.heading).toEqual({ east: 0.707106781187, north: 0.707106781187, up: 0 });
    expect(s2!.direction).toBeUndefined();
    expect(bends[0]!.heading).toEqual(s2!.heading);
    expect(bends[1]!.direction).toBe('east');
    expect(s3!.direction).toBe('east');
    // The document stays valid for the server and the checker.
    expect(parseSpoolDocument(store.getState().doc).ok).toBe(true);
  });

  it('undoes and redoes angled legs one step each', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg('east', 100);
    const afterEast = store.getState().doc;
    s.addLeg(NE45(), 50);
    const afterOffset = store.getState().doc;
    s.addLeg('east', 100);
    const full = store.getState().doc;
    s.undo();
    expect(store.getState().doc).toBe(afterOffset);
    s.undo();
    expect(store.getState().doc).toBe(afterEast);
    expect(store.getState().doc.elements).toHaveLength(1);
    s.redo();
    s.redo();
    expect(store.getState().doc).toBe(full);
    expect(store.getState().canRedo).toBe(false);
  });

  it('draws a rolled offset: 45° from east toward north rolled 30° toward up is one 45° bend each way', () => {
    const store = fresh();
    const s = store.getState();
    const rolled = heading({
      from: 'east',
      toward: 'north',
      angle: 45,
      rollToward: 'up',
      roll: 30,
    });
    // cos45·E + sin45·(cos30·N + sin30·Up)
    expect(rolled.east).toBeCloseTo(Math.SQRT1_2, 9);
    expect(rolled.north).toBeCloseTo(Math.SQRT1_2 * Math.cos(Math.PI / 6), 9);
    expect(rolled.up).toBeCloseTo(Math.SQRT1_2 * 0.5, 9);
    s.addLeg('east', 80);
    expect(s.addLeg(rolled, 60)).toEqual({ ok: true });
    expect(s.addLeg('east', 80)).toEqual({ ok: true });
    const bends = store.getState().doc.elements.filter(isBend);
    expect(bends.map((b) => b.angle)).toEqual([45, 45]);
    expect(store.getState().doc.elements.filter(isStraight)[1]!.length).toBeCloseTo(
      60 - 2 * T45,
      5,
    );
  });

  it('rolls a leg up from east by 30°: a 30° bend with R·tan(15°) tangents', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg('east', 50);
    expect(s.addLeg(heading({ from: 'east', toward: 'up', angle: 30 }), 40)).toEqual({ ok: true });
    const [b] = store.getState().doc.elements.filter(isBend);
    expect(b!.angle).toBe(30);
    const [s1, s2] = store.getState().doc.elements.filter(isStraight);
    expect(s1!.length).toBeCloseTo(50 - T30, 5); // 48.392305
    expect(s2!.length).toBeCloseTo(40 - T30, 5);
  });

  it('takes the bend angle as the angle between the legs, whatever their planes', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg(NE45(), 50);
    s.addLeg('north', 50); // NE → N: 45°
    s.addLeg(heading({ from: 'north', toward: 'west', angle: 45 }), 50); // N → NW: 45°
    s.addLeg(heading({ from: 'south', toward: 'west', angle: 45 }), 50); // NW → SW: 90°
    expect(
      store
        .getState()
        .doc.elements.filter(isBend)
        .map((b) => b.angle),
    ).toEqual([45, 45, 90]);
  });

  it('merges a leg drawn the same way as the last one (no bend)', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg(NE45(), 50);
    s.addLeg(NE45(), 20);
    const els = store.getState().doc.elements;
    expect(els.every(isStraight)).toBe(true);
    expect(els).toHaveLength(2);
  });

  it('refuses a reversal and a leg too short for its bends, with the tangent named', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg(NE45(), 50);
    const before = store.getState().doc;
    const sw = heading({ from: 'west', toward: 'south', angle: 45 });
    expect(s.addLeg(sw, 50)).toEqual({
      ok: false,
      message: 'a leg cannot double back on the previous one',
    });
    // A 90° turn (NE → SE) needs R·tan(45°) = 6 in from the new leg.
    const r = s.addLeg(heading({ from: 'east', toward: 'south', angle: 45 }), 5);
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.message).toMatch(
        /this leg \(5 in\) is too short for its bend: it must be longer than 6 in/,
      );
    expect(store.getState().doc).toBe(before);
    // Between two 45° bends a leg needs more than 2 × 2.485 = 4.971 in.
    const store2 = fresh();
    store2.getState().addLeg('east', 50);
    store2.getState().addLeg(NE45(), 4.5);
    const r2 = store2.getState().addLeg('east', 50);
    expect(r2.ok).toBe(false);
    if (!r2.ok)
      expect(r2.message).toMatch(
        /is too short for the bends at its ends: it must be longer than 4\.971 in/,
      );
  });

  it('refuses a heading of zero length, naming the field', () => {
    const store = fresh();
    const r = store.getState().addLeg({ east: 0, north: 0, up: 0 }, 10);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^heading: must not be zero/);
  });

  it('inserts an angled leg after the selected straight', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg('east', 100);
    s.addLeg('north', 60);
    expect(
      s.insertLegAfter('S1', heading({ from: 'east', toward: 'down', angle: 45 }), 30),
    ).toEqual({ ok: true });
    const bends = store.getState().doc.elements.filter(isBend);
    // east → 45° down → north: 45°, then between the down-east leg and north: 90°.
    expect(bends.map((b) => b.angle)).toEqual([45, 90]);
  });

  it('turns a straight to a heading through updateElement', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg('east', 100);
    s.addLeg('north', 60);
    expect(s.updateElement('S2', { heading: NE45() })).toEqual({ ok: true });
    expect(store.getState().doc.elements.filter(isBend)[0]!.angle).toBe(45);
    expect(s.updateElement('S2', { heading: { east: Number.NaN, north: 1, up: 0 } }).ok).toBe(
      false,
    );
  });

  it('loads old documents (axis directions only) and documents with headings', () => {
    const old = {
      ...doc(),
      elements: [
        { kind: 'straight', id: 'S1', nps: '2', schedule: '40', length: 10, direction: 'east' },
      ],
    };
    expect(parseSpoolDocument(old).ok).toBe(true);
    const withHeading = {
      ...doc(),
      elements: [
        {
          kind: 'straight',
          id: 'S1',
          nps: '2',
          schedule: '40',
          length: 10,
          heading: { east: 1, north: 1, up: 0 },
        },
      ],
    };
    expect(parseSpoolDocument(withHeading).ok).toBe(true);
    const bad = {
      ...doc(),
      elements: [
        {
          kind: 'straight',
          id: 'S1',
          nps: '2',
          schedule: '40',
          length: 10,
          heading: { east: 0, north: 0, up: 0 },
        },
      ],
    };
    const r = parseSpoolDocument(bad);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]!.path).toBe('elements[0].heading');
  });
});

describe('editing a bend angle', () => {
  it('turns the leg after the bend in the bend plane and re-angles the next bend', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg('east', 100);
    s.addLeg('north', 50);
    s.addLeg('east', 100);
    expect(s.updateElement('B1', { angle: 45 })).toEqual({ ok: true });
    const els = store.getState().doc.elements;
    const bends = els.filter(isBend);
    // east → (45° toward north) → east: a 45° offset, both bends 45°.
    expect(bends.map((b) => b.angle)).toEqual([45, 45]);
    expect(els.filter(isStraight)[1]!.heading).toEqual({
      east: 0.707106781187,
      north: 0.707106781187,
      up: 0,
    });
    // Leg lengths stay: the offset leg is still 50 in, so its cut is 50 − 2·R·tan(22.5°).
    expect(els.filter(isStraight)[1]!.length).toBeCloseTo(50 - 2 * T45, 5);
    s.undo();
    expect(
      store
        .getState()
        .doc.elements.filter(isBend)
        .map((b) => b.angle),
    ).toEqual([90, 90]);
  });

  it('refuses 180°, zero and an angle on a straight, naming the field', () => {
    const store = fresh();
    const s = store.getState();
    s.addLeg('east', 100);
    s.addLeg('north', 50);
    expect(s.updateElement('B1', { angle: 180 })).toMatchObject({
      ok: false,
      message: expect.stringMatching(/^angle: must be less than 180/),
    });
    expect(s.updateElement('B1', { angle: 0 })).toMatchObject({
      ok: false,
      message: 'angle: must be greater than zero',
    });
    expect(s.updateElement('S1', { angle: 30 })).toMatchObject({
      ok: false,
      message: 'angle: a straight has no bend angle',
    });
  });
});

describe('focus on selected', () => {
  it('asks the canvas to frame the selected element, refused without one', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    expect(store.getState().requestFocus().ok).toBe(false);
    store.getState().select('S1');
    expect(store.getState().requestFocus()).toEqual({ ok: true });
    expect(store.getState().view.focus).toEqual({ id: 'S1', request: 1 });
    store.getState().requestFocus();
    expect(store.getState().view.focus?.request).toBe(2);
    expect(store.getState().past).toHaveLength(1); // the view never enters history
  });
});
