import { describe, expect, it } from 'vitest';
import type { SpoolDocument } from '@shared/model/spool';
import { buildSpoolPath } from '@/features/sketch/geometry/spool-path';
import { centreOf } from '@/features/sketch/canvas/comment-badges';

const doc: SpoolDocument = {
  units: 'imperial',
  conditions: { pressure: 150, temperature: 100, material: 'A106-B' },
  elements: [
    { kind: 'straight', id: 'S1', nps: '2', schedule: '40', length: 30, direction: 'east' },
    {
      kind: 'bend',
      id: 'B1',
      nps: '2',
      schedule: '40',
      bendRadius: { multipleOfD: 3 },
      angle: 90,
      direction: 'north',
    },
    { kind: 'straight', id: 'S2', nps: '2', schedule: '40', length: 30, direction: 'north' },
  ],
};

describe('comment badge anchor', () => {
  const path = buildSpoolPath(doc);
  it('is the middle of a straight', () => {
    const s1 = path.byId.get('S1')!;
    if (s1.kind !== 'straight') throw new Error('S1 is not a straight');
    const [x, y, z] = centreOf(s1);
    expect(x).toBeCloseTo((s1.start.x + s1.end.x) / 2, 9);
    expect(y).toBeCloseTo((s1.start.y + s1.end.y) / 2, 9);
    expect(z).toBeCloseTo((s1.start.z + s1.end.z) / 2, 9);
  });
  it('lies on a bend’s arc, halfway between its ends', () => {
    const b1 = path.byId.get('B1')!;
    if (b1.kind !== 'bend') throw new Error('B1 is not a bend');
    const p = centreOf(b1);
    const d = (a: { x: number; y: number; z: number }) =>
      Math.hypot(p[0] - a.x, p[1] - a.y, p[2] - a.z);
    // on the centreline: R1 from the centre of curvature (3D of NPS 2 = 6 in, common practice)
    expect(d(b1.centre)).toBeCloseTo(6, 9);
    expect(d(b1.start)).toBeCloseTo(d(b1.end), 9);
  });
});
