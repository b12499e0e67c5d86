import { describe, expect, it } from 'vitest';
import type { SpoolDocument } from '@shared/model/spool';
import { diffDocuments } from '@/features/sketch/components/document-diff';

const base: SpoolDocument = {
  units: 'imperial',
  name: 'A',
  conditions: { pressure: 150, temperature: 100, material: 'A106-B' },
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

describe('document diff for save conflicts', () => {
  it('is empty for equal documents', () => {
    expect(diffDocuments(base, structuredClone(base) as SpoolDocument)).toEqual([]);
  });

  it('names changed fields, added and removed elements, conditions and order', () => {
    const mine: SpoolDocument = {
      ...base,
      name: 'B',
      conditions: { ...base.conditions, pressure: 300 },
      elements: [
        { ...base.elements[0]!, schedule: '80' } as SpoolDocument['elements'][number],
        base.elements[1]!,
        { kind: 'straight', id: 'S9', nps: '2', schedule: '40', length: 5 },
      ],
    };
    expect(diffDocuments(mine, base)).toEqual([
      { target: 'spool', change: 'changed', fields: ['name'] },
      { target: 'conditions', change: 'changed', fields: ['pressure'] },
      { target: 'S1', change: 'changed', fields: ['schedule'] },
      { target: 'S9', change: 'added', fields: [] },
      { target: 'S2', change: 'removed', fields: [] },
    ]);
    const swapped = {
      ...base,
      elements: [base.elements[2]!, base.elements[1]!, base.elements[0]!],
    };
    expect(diffDocuments(swapped, base)).toEqual([
      { target: 'spool', change: 'changed', fields: ['elements order'] },
    ]);
  });
});
