import { describe, expect, it } from 'vitest';
import type { SpoolDocument } from '@shared/model/spool';
import { checkSpool, createSpoolChecker } from '@shared/engine/index';

const doc: SpoolDocument = {
  units: 'imperial',
  conditions: { pressure: 400, temperature: 300, material: 'A106-B', corrosionAllowance: 0.0625 },
  elements: [
    { id: 'S1', kind: 'straight', nps: '6', schedule: '40', length: 60 },
    { id: 'B1', kind: 'bend', nps: '6', schedule: '40', bendRadius: { multipleOfD: 3 }, angle: 90 },
    { id: 'S2', kind: 'straight', nps: '6', schedule: '40', length: 30 },
  ],
};

describe('memoizing checker', () => {
  it('gives the same results as checkSpool, before and after edits', () => {
    const checker = createSpoolChecker();
    expect(checker(doc)).toEqual(checkSpool(doc));
    const edited = {
      ...doc,
      elements: doc.elements.map((e) => (e.id === 'B1' ? { ...e, schedule: '10' } : e)),
    };
    const a = checker(edited);
    expect(a).toEqual(checkSpool(edited));
    // Unchanged elements are reused by identity; the edited one is re-checked.
    const before = checker(doc);
    const after = checker(edited);
    expect(after.elements[0]).toBe(checker(edited).elements[0]);
    expect(after.elements[1]).not.toBe(before.elements[1]);
  });
  it('re-checks everything when the spool conditions change', () => {
    const checker = createSpoolChecker();
    checker(doc);
    const hotter = { ...doc, conditions: { ...doc.conditions, pressure: 2000 } };
    expect(checker(hotter)).toEqual(checkSpool(hotter));
  });
  it('re-checks an element that moved position (index is part of its result)', () => {
    const checker = createSpoolChecker();
    checker(doc);
    const moved = { ...doc, elements: [...doc.elements].reverse() };
    expect(checker(moved)).toEqual(checkSpool(moved));
  });
});
