import { describe, expect, it } from 'vitest';
import { checkSpool } from '@shared/engine';
import type { SpoolDocument } from '@shared/model/spool';
import { diffFields } from '@/features/sketch/components/document-diff';
import { diffRevisions, formatDiffValue, isEmptyDiff } from '@/features/review/revision-diff';

const rev0: SpoolDocument = {
  units: 'imperial',
  name: 'Diff spool',
  line: 'L-1',
  conditions: { pressure: 150, temperature: 100, material: 'A106-B', corrosionAllowance: 0.0625 },
  elements: [
    { kind: 'straight', id: 'S1', nps: '2', schedule: '40', length: 30, direction: 'east' },
    {
      kind: 'bend',
      id: 'B1',
      nps: '2',
      schedule: '40',
      bendRadius: { multipleOfD: 1.5 },
      angle: 90,
      direction: 'north',
    },
    { kind: 'straight', id: 'S2', nps: '2', schedule: '40', length: 30, direction: 'north' },
  ],
};

describe('field diff', () => {
  it('walks nested objects and names both values', () => {
    expect(diffFields({ a: 1, c: { x: 1, y: 2 } }, { a: 2, b: 'new', c: { x: 1, y: 3 } })).toEqual([
      { field: 'a', before: 1, after: 2 },
      { field: 'b', before: undefined, after: 'new' },
      { field: 'c.y', before: 2, after: 3 },
    ]);
  });
  it('lists the fields of an object that appears on one side', () => {
    expect(diffFields({}, { conditions: { pressure: 300 } })).toEqual([
      { field: 'conditions.pressure', before: undefined, after: 300 },
    ]);
  });
  it('is empty for equal values', () => {
    expect(diffFields(rev0, structuredClone(rev0))).toEqual([]);
  });
});

describe('revision diff', () => {
  it('is empty for the same document', () => {
    const d = diffRevisions(
      { revision: 0, document: rev0 },
      { revision: 1, document: structuredClone(rev0) as SpoolDocument },
    );
    expect(isEmptyDiff(d)).toBe(true);
  });

  it('lists added, removed and changed elements with old → new values', () => {
    const rev1: SpoolDocument = {
      ...rev0,
      line: 'L-2',
      conditions: { ...rev0.conditions, pressure: 300 },
      elements: [
        rev0.elements[0]!,
        {
          ...rev0.elements[1]!,
          schedule: '80',
          bendRadius: { multipleOfD: 3 },
        } as SpoolDocument['elements'][number],
        { kind: 'straight', id: 'S3', nps: '2', schedule: '40', length: 12, direction: 'north' },
      ],
    };
    const d = diffRevisions({ revision: 0, document: rev0 }, { revision: 1, document: rev1 });
    expect(d.from).toBe(0);
    expect(d.to).toBe(1);
    expect(d.added).toEqual([{ id: 'S3', kind: 'straight' }]);
    expect(d.removed).toEqual([{ id: 'S2', kind: 'straight' }]);
    expect(d.changed).toEqual([
      { target: 'spool', fields: [{ field: 'line', before: 'L-1', after: 'L-2' }] },
      { target: 'conditions', fields: [{ field: 'pressure', before: 150, after: 300 }] },
      {
        target: 'B1',
        fields: [
          { field: 'bendRadius.multipleOfD', before: 1.5, after: 3 },
          { field: 'schedule', before: '40', after: '80' },
        ],
      },
    ]);
  });

  it('names a reordering of kept elements', () => {
    const swapped: SpoolDocument = {
      ...rev0,
      elements: [rev0.elements[2]!, rev0.elements[1]!, rev0.elements[0]!],
    };
    const d = diffRevisions({ revision: 0, document: rev0 }, { revision: 1, document: swapped });
    expect(d.changed).toEqual([
      {
        target: 'spool',
        fields: [{ field: 'elements order', before: 'S1 B1 S2', after: 'S2 B1 S1' }],
      },
    ]);
  });

  it('reports check status changes of kept elements', () => {
    // 2" Sch 40 at 1500 psi: the 1.5D bend's intrados needs more wall than the nominal 0.154 in
    // (B31.3 para. 304.2.1, Eq. 3c) and the straights too (Eq. 3a): all three fail.
    const hot: SpoolDocument = { ...rev0, conditions: { ...rev0.conditions, pressure: 1500 } };
    const a = { revision: 0, document: rev0, check: checkSpool(rev0) };
    const b = { revision: 1, document: hot, check: checkSpool(hot) };
    expect(a.check.elements.map((e) => e.status)).toEqual(['pass', 'pass', 'pass']);
    const d = diffRevisions(a, b);
    expect(d.statusChanges.map((s) => `${s.id}:${s.before}>${s.after}`)).toEqual([
      'S1:pass>fail',
      'B1:pass>fail',
      'S2:pass>fail',
    ]);
    expect(d.changed).toEqual([
      { target: 'conditions', fields: [{ field: 'pressure', before: 150, after: 1500 }] },
    ]);
  });

  it('formats values for display', () => {
    expect(formatDiffValue(undefined)).toBe('—');
    expect(formatDiffValue('80')).toBe('80');
    expect(formatDiffValue(1.5)).toBe('1.5');
    expect(formatDiffValue({ multipleOfD: 3 })).toBe('{"multipleOfD":3}');
  });
});
