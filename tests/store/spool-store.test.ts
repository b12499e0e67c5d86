import { describe, expect, it } from 'vitest';
import { isBend, isStraight, type SpoolDocument } from '@shared/model/spool';
import { createSpoolStore } from '@/features/sketch/store/spool-store';

// 2" pipe, default bend radius 3D = 3 × nominal size = 6 in (common practice "nD" = n × NPS);
// a 90° bend then needs R·tan(45°) = 6 in of tangent at each end.
const doc = (): SpoolDocument => ({
  units: 'imperial',
  name: 'Test spool',
  conditions: { pressure: 300, temperature: 200, material: 'A106-B' },
  defaultBendRadius: { multipleOfD: 3 },
  elements: [],
});

const fresh = () => {
  const store = createSpoolStore(doc());
  store.getState().startRun({ nps: '2', schedule: '40' }, { history: 'never' });
  return store;
};

const shape = (store: ReturnType<typeof fresh>) =>
  store
    .getState()
    .doc.elements.map((e) =>
      e.kind === 'straight'
        ? `${e.id}:${e.direction}:${e.length}`
        : `${e.id}:${e.angle}>${e.direction}`,
    );

describe('drawing legs', () => {
  it('inserts a 90° bend with the default radius at each change of direction', () => {
    const store = fresh();
    const s = store.getState();
    expect(s.addLeg('east', 100)).toEqual({ ok: true });
    expect(s.addLeg('north', 50)).toEqual({ ok: true });
    expect(s.addLeg('up', 30)).toEqual({ ok: true });
    const els = store.getState().doc.elements;
    expect(els.map((e) => e.kind)).toEqual(['straight', 'bend', 'straight', 'bend', 'straight']);
    const bends = els.filter(isBend);
    expect(bends).toHaveLength(2);
    expect(bends.map((b) => b.angle)).toEqual([90, 90]);
    expect(bends.map((b) => b.bendRadius)).toEqual([{ multipleOfD: 3 }, { multipleOfD: 3 }]);
    expect(bends.map((b) => b.direction)).toEqual(['north', 'up']);
    // Cut lengths = leg length − 6 in per bend end.
    expect(els.filter(isStraight).map((e) => e.length)).toEqual([94, 38, 24]);
    expect(bends.every((b) => b.nps === '2' && b.schedule === '40')).toBe(true);
  });

  it('adds a straight to the same leg when the direction does not change', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('east', 40);
    expect(shape(store)).toEqual(['S1:east:100', 'S2:east:40']);
    store.getState().addLeg('south', 20);
    // Only the last straight of the leg gives up tangent.
    expect(shape(store)).toEqual(['S1:east:100', 'S2:east:34', 'B1:90>south', 'S3:south:14']);
  });

  it('uses a default radius given as a length', () => {
    const store = fresh();
    store.getState().setDefaultBendRadius(10);
    store.getState().addLeg('east', 100);
    store.getState().addLeg('down', 50);
    const b = store.getState().doc.elements.find(isBend)!;
    expect(b.bendRadius).toBe(10);
    expect(shape(store)).toEqual(['S1:east:90', 'B1:90>down', 'S2:down:40']);
  });

  it('refuses a reversal with a message', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    const r = store.getState().addLeg('west', 50);
    expect(r).toEqual({ ok: false, message: 'a leg cannot double back on the previous one' });
    expect(store.getState().doc.elements).toHaveLength(1);
  });

  it('refuses a new leg not longer than the bend tangent', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    const r = store.getState().addLeg('north', 6);
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.message).toMatch(/this leg \(6 in\) is too short.*longer than 6 in.*R·tan\(θ\/2\)/);
    expect(store.getState().doc.elements).toHaveLength(1);
    expect(store.getState().past).toHaveLength(1);
  });

  it('refuses a turn when the previous leg is too short for the new bend', () => {
    const store = fresh();
    store.getState().addLeg('east', 5);
    const r = store.getState().addLeg('north', 100);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/leg S1 \(5 in\) is too short/);
  });

  it('needs both tangents on a leg between two bends', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 12.5); // 12.5 − 6 = 6.5 so far
    const r = store.getState().addLeg('up', 50); // would leave 12.5 − 12 = 0.5: still fine
    expect(r.ok).toBe(true);
    const store2 = fresh();
    store2.getState().addLeg('east', 100);
    store2.getState().addLeg('north', 12);
    const r2 = store2.getState().addLeg('up', 50);
    expect(r2.ok).toBe(false);
    if (!r2.ok) expect(r2.message).toMatch(/longer than 12 in.*both bends/);
  });

  it('refuses non-positive lengths and unknown elements', () => {
    const store = fresh();
    expect(store.getState().addLeg('east', 0).ok).toBe(false);
    expect(store.getState().addLeg('east', Number.NaN).ok).toBe(false);
    expect(store.getState().updateElement('S99', { length: 3 })).toEqual({
      ok: false,
      message: 'no element "S99"',
    });
  });

  it('gives stable, unique ids that are never reused after delete', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 100);
    store.getState().deleteElement('S2');
    store.getState().addLeg('up', 100);
    const ids = store.getState().doc.elements.map((e) => e.id);
    expect(ids).toEqual(['S1', 'B2', 'S3']);
    expect(new Set(ids).size).toBe(ids.length);
  });
});

describe('editing elements', () => {
  const drawn = () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 50);
    store.getState().addLeg('east', 80);
    return store; // S1 B1 S2 B2 S3
  };

  it('changes a cut length and a leg length', () => {
    const store = drawn();
    expect(store.getState().updateElement('S2', { length: 40 }).ok).toBe(true);
    expect(shape(store)).toEqual([
      'S1:east:94',
      'B1:90>north',
      'S2:north:40',
      'B2:90>east',
      'S3:east:74',
    ]);
    expect(store.getState().updateElement('S2', { legLength: 30 }).ok).toBe(true);
    expect(shape(store)[2]).toBe('S2:north:18');
    const r = store.getState().updateElement('S2', { legLength: 12 });
    expect(r.ok).toBe(false);
    expect(store.getState().updateElement('S2', { length: -1 }).ok).toBe(false);
  });

  it('keeps leg lengths when a bend radius changes, refusing what no longer fits', () => {
    const store = drawn();
    expect(store.getState().updateElement('B1', { bendRadius: 10 }).ok).toBe(true);
    expect(shape(store)).toEqual([
      'S1:east:90',
      'B1:90>north',
      'S2:north:34',
      'B2:90>east',
      'S3:east:74',
    ]);
    const r = store.getState().updateElement('B1', { bendRadius: 45 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/leg S2 \(50 in\) is too short for the bends at its ends/);
    expect(store.getState().updateElement('B1', { bendRadius: { multipleOfD: 0 } }).ok).toBe(false);
  });

  it('turns a leg: bends follow, same-direction legs merge, reversals are refused', () => {
    const store = drawn();
    expect(store.getState().updateElement('S2', { direction: 'up' }).ok).toBe(true);
    expect(shape(store)).toEqual([
      'S1:east:94',
      'B1:90>up',
      'S2:up:38',
      'B2:90>east',
      'S3:east:74',
    ]);
    // Turning the last leg north makes it perpendicular to "up": the bend re-aims.
    expect(store.getState().updateElement('S3', { direction: 'north' }).ok).toBe(true);
    expect(shape(store)[3]).toBe('B2:90>north');
    // Turning S3 up merges it into S2's leg: the bend between them goes, leg lengths add.
    expect(store.getState().updateElement('S3', { direction: 'up' }).ok).toBe(true);
    expect(shape(store)).toEqual(['S1:east:94', 'B1:90>up', 'S2:up:44', 'S3:up:80']);
    const r = store.getState().updateElement('S2', { direction: 'west' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/double back/);
  });

  it('turning a bend turns the whole leg after it', () => {
    const store = drawn();
    expect(store.getState().updateElement('B1', { direction: 'down' }).ok).toBe(true);
    expect(shape(store)).toEqual([
      'S1:east:94',
      'B1:90>down',
      'S2:down:38',
      'B2:90>east',
      'S3:east:74',
    ]);
    expect(store.getState().updateElement('B1', { angle: 45 } as never).ok).toBe(true); // unknown keys are ignored
    expect(store.getState().updateElement('B1', { direction: 'west' }).ok).toBe(false);
  });

  it('keeps a loaded document with a 45° bend as it is when editing elsewhere', () => {
    const loaded = createSpoolStore({
      ...doc(),
      elements: [
        { kind: 'straight', id: 'S1', nps: '2', schedule: '40', length: 50, direction: 'east' },
        {
          kind: 'bend',
          id: 'B1',
          nps: '2',
          schedule: '40',
          bendRadius: 10,
          angle: 45,
          direction: 'north',
        },
        { kind: 'straight', id: 'S2', nps: '2', schedule: '40', length: 30 },
      ],
    });
    expect(loaded.getState().updateElement('S2', { length: 40 }).ok).toBe(true);
    const els = loaded.getState().doc.elements;
    expect(els[1]).toEqual({
      kind: 'bend',
      id: 'B1',
      nps: '2',
      schedule: '40',
      bendRadius: 10,
      angle: 45,
      direction: 'north',
    });
    expect(els[2]).toMatchObject({ id: 'S2', length: 40 });
    expect(els[2]!.direction).toBeUndefined();
  });

  it('works in metric units (3D of NPS 2 = 152.4 mm)', () => {
    const store = createSpoolStore({
      ...doc(),
      units: 'metric',
      conditions: { pressure: 2, temperature: 50, material: 'A106-B' },
    });
    store.getState().startRun({ nps: '2', schedule: '40' });
    store.getState().addLeg('east', 1000);
    expect(store.getState().addLeg('north', 150).ok).toBe(false);
    store.getState().addLeg('north', 500);
    expect(shape(store)).toEqual(['S1:east:847.6', 'B1:90>north', 'S2:north:347.6']);
  });

  it('refuses fields an element does not have', () => {
    const store = drawn();
    expect(store.getState().updateElement('B1', { length: 5 }).ok).toBe(false);
    expect(store.getState().updateElement('S1', { bendRadius: 5 }).ok).toBe(false);
  });

  it('sets size, end type and merges condition overrides', () => {
    const store = drawn();
    expect(
      store.getState().updateElement('S1', { nps: '3', schedule: '80', endType: 'threaded' }).ok,
    ).toBe(true);
    expect(
      store.getState().updateElement('S1', { conditions: { corrosionAllowance: 0.0625 } }).ok,
    ).toBe(true);
    expect(store.getState().updateElement('S1', { conditions: { pressure: 500 } }).ok).toBe(true);
    let s1 = store.getState().doc.elements[0]!;
    expect(s1).toMatchObject({
      nps: '3',
      schedule: '80',
      endType: 'threaded',
      conditions: { corrosionAllowance: 0.0625, pressure: 500 },
    });
    store.getState().updateElement('S1', { conditions: { pressure: undefined } });
    s1 = store.getState().doc.elements[0]!;
    expect(s1.conditions).toEqual({ corrosionAllowance: 0.0625 });
    store.getState().updateElement('S1', { conditions: null });
    expect(store.getState().doc.elements[0]!.conditions).toBeUndefined();
    expect(store.getState().updateElement('S1', { conditions: { millTolerance: 2 } }).ok).toBe(
      false,
    );
  });

  it('a bend size change alters its tangent (3D of a 4" bend = 12 in)', () => {
    const store = drawn();
    expect(store.getState().updateElement('B1', { nps: '4', schedule: '40' }).ok).toBe(true);
    expect(shape(store).slice(0, 3)).toEqual(['S1:east:88', 'B1:90>north', 'S2:north:32']);
  });

  it('inserts a leg after a straight and after a bend', () => {
    const store = drawn();
    expect(store.getState().insertLegAfter('S1', 'up', 20).ok).toBe(true);
    // east 100 → up 20 → north 50 → east 80
    expect(shape(store)).toEqual([
      'S1:east:94',
      'B3:90>up',
      'S4:up:8',
      'B1:90>north',
      'S2:north:38',
      'B2:90>east',
      'S3:east:74',
    ]);
    const store2 = drawn();
    // Inserting along the same direction lengthens the leg as another straight.
    expect(store2.getState().insertLegAfter('B1', 'north', 20).ok).toBe(true);
    expect(shape(store2)).toEqual([
      'S1:east:94',
      'B1:90>north',
      'S4:north:14',
      'S2:north:44',
      'B2:90>east',
      'S3:east:74',
    ]);
    expect(store2.getState().insertLegAfter('S1', 'west', 20).ok).toBe(false);
  });

  it('inserts in the middle of a leg by splitting it', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('east', 50);
    expect(store.getState().insertLegAfter('S1', 'down', 30).ok).toBe(true);
    expect(shape(store)).toEqual([
      'S1:east:94',
      'B1:90>down',
      'S3:down:18',
      'B2:90>east',
      'S2:east:44',
    ]);
  });
});

describe('deleting keeps the run coherent', () => {
  it('deleting the last leg removes its bend and gives the tangent back', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 50);
    expect(store.getState().deleteElement('S2').ok).toBe(true);
    expect(shape(store)).toEqual(['S1:east:100']);
  });

  it('deleting a leg between bends that then run the same way removes both bends', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 50);
    store.getState().addLeg('east', 80);
    expect(store.getState().deleteElement('S2').ok).toBe(true);
    expect(shape(store)).toEqual(['S1:east:100', 'S3:east:80']);
  });

  it('deleting a leg between perpendicular legs merges its two bends into one', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 50);
    store.getState().addLeg('up', 80);
    expect(store.getState().deleteElement('S2').ok).toBe(true);
    expect(shape(store)).toEqual(['S1:east:94', 'B1:90>up', 'S3:up:74']);
  });

  it('refuses a delete that would double the run back', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 50);
    store.getState().addLeg('west', 80);
    const r = store.getState().deleteElement('S2');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe('deleting S2 would make the run double back on itself');
    expect(store.getState().doc.elements).toHaveLength(5);
  });

  it('refuses deleting a bend that joins a change of direction; allows a trailing bend', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 50);
    expect(store.getState().deleteElement('B1').ok).toBe(false);
    const loaded = createSpoolStore({
      ...doc(),
      elements: [
        { kind: 'straight', id: 'S1', nps: '2', schedule: '40', length: 50, direction: 'east' },
        {
          kind: 'bend',
          id: 'B1',
          nps: '2',
          schedule: '40',
          bendRadius: { multipleOfD: 3 },
          angle: 90,
          direction: 'up',
        },
      ],
    });
    expect(loaded.getState().deleteElement('B1').ok).toBe(true);
    expect(loaded.getState().doc.elements.map((e) => e.id)).toEqual(['S1']);
  });

  it('deleting the only straight empties the run', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    expect(store.getState().deleteElement('S1').ok).toBe(true);
    expect(store.getState().doc.elements).toEqual([]);
  });
});

describe('history', () => {
  it('undoes and redoes every kind of document change', () => {
    const store = fresh();
    const s = () => store.getState();
    const snapshots = [s().doc];
    const changes: (() => unknown)[] = [
      () => s().addLeg('east', 100),
      () => s().addLeg('north', 50),
      () => s().insertLegAfter('S1', 'up', 30),
      () => s().updateElement('S2', { length: 20 }),
      () => s().updateElement('B1', { bendRadius: 8 }),
      () => s().deleteElement('S2'),
      () => s().setConditions({ pressure: 400 }),
      () => s().setMeta({ name: 'Renamed', line: 'L-100' }),
      () => s().setDefaultBendRadius({ multipleOfD: 5 }),
      () => s().startRun({ nps: '3', schedule: '80' }),
    ];
    for (const change of changes) {
      change();
      expect(s().doc).not.toBe(snapshots[snapshots.length - 1]);
      snapshots.push(s().doc);
    }
    expect(s().past).toHaveLength(changes.length);
    for (let i = snapshots.length - 2; i >= 0; i--) {
      s().undo();
      expect(s().doc).toBe(snapshots[i]);
    }
    expect(s().canUndo).toBe(false);
    expect(s().canRedo).toBe(true);
    for (let i = 1; i < snapshots.length; i++) {
      s().redo();
      expect(s().doc).toBe(snapshots[i]);
    }
    expect(s().canRedo).toBe(false);
  });

  it('a new change clears the redo stack; refused changes add no step', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 50);
    store.getState().undo();
    expect(store.getState().canRedo).toBe(true);
    store.getState().addLeg('up', 50);
    expect(store.getState().canRedo).toBe(false);
    const steps = store.getState().past.length;
    store.getState().addLeg('down', 50);
    expect(store.getState().past.length).toBe(steps);
  });

  it('selection and hover never enter history, and are cleared when the element goes', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().addLeg('north', 50);
    const steps = store.getState().past.length;
    store.getState().select('S2');
    store.getState().hover('B1');
    expect(store.getState().past.length).toBe(steps);
    expect(store.getState().selectedId).toBe('S2');
    store.getState().undo();
    expect(store.getState().selectedId).toBeNull();
    expect(store.getState().hoveredId).toBeNull();
    store.getState().redo();
    store.getState().select('S1');
    store.getState().undo();
    expect(store.getState().selectedId).toBe('S1');
  });

  it('a gesture makes one undo step; "never" changes make none', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    const before = store.getState().doc;
    const steps = store.getState().past.length;
    for (const len of [90, 80, 70])
      store.getState().updateElement('S1', { length: len }, { history: 'gesture' });
    store.getState().endGesture();
    expect(store.getState().past.length).toBe(steps + 1);
    store.getState().undo();
    expect(store.getState().doc).toBe(before);
    store.getState().beginGesture();
    store.getState().updateElement('S1', { length: 60 });
    store.getState().updateElement('S1', { length: 50 });
    store.getState().endGesture();
    expect(store.getState().past.length).toBe(steps + 1);
    store.getState().setConditions({ temperature: 300 }, { history: 'never' });
    expect(store.getState().past.length).toBe(steps + 1);
  });

  it('load clears history and marks the document saved; dirty follows undo back to it', () => {
    const store = fresh();
    store.getState().addLeg('east', 100);
    store.getState().load(doc(), 3);
    expect(store.getState().canUndo).toBe(false);
    expect(store.getState().isDirty).toBe(false);
    expect(store.getState().savedVersion).toBe(3);
    store.getState().addLeg('east', 100);
    expect(store.getState().isDirty).toBe(true);
    store.getState().undo();
    expect(store.getState().isDirty).toBe(false);
    store.getState().redo();
    const sent = store.getState().doc;
    store.getState().addLeg('up', 40);
    // A save of an earlier document that completes after another edit leaves the store dirty.
    store.getState().markSaved(4, sent);
    expect(store.getState().isDirty).toBe(true);
    store.getState().markSaved(5);
    expect(store.getState().isDirty).toBe(false);
    expect(store.getState().savedVersion).toBe(5);
  });

  it('refuses invalid conditions and keeps required keys', () => {
    const store = fresh();
    expect(store.getState().setConditions({ pressure: -1 }).ok).toBe(false);
    expect(store.getState().setConditions({ pressure: undefined }).ok).toBe(false);
    expect(store.getState().setConditions({ corrosionAllowance: 0.05 }).ok).toBe(true);
    expect(store.getState().doc.conditions.corrosionAllowance).toBe(0.05);
  });
});

describe('replacing the document (import)', () => {
  it('is one undo step that keeps the saved reference, so the import is an unsaved change', () => {
    const store = createSpoolStore();
    const s = store.getState();
    s.startRun({ nps: '4', schedule: '40' });
    s.addLeg('east', 100);
    store.getState().markSaved(3);
    const before = store.getState().doc;
    const imported: SpoolDocument = {
      units: 'metric',
      conditions: { pressure: 1, temperature: 20, material: 'A312-TP316L' },
      elements: [
        { id: 'S7', kind: 'straight', nps: '2', schedule: '10S', length: 500, direction: 'north' },
      ],
    };
    store.getState().replaceDocument(imported);
    expect(store.getState().doc).toBe(imported);
    expect(store.getState().isDirty).toBe(true);
    expect(store.getState().savedVersion).toBe(3);
    store.getState().undo();
    expect(store.getState().doc).toBe(before);
    expect(store.getState().isDirty).toBe(false);
    store.getState().redo();
    expect(store.getState().doc).toBe(imported);
    // New ids continue past the imported ones.
    store.getState().addLeg('east', 1000);
    expect(new Set(store.getState().doc.elements.map((e) => e.id)).size).toBe(
      store.getState().doc.elements.length,
    );
  });
});
