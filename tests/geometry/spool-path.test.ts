import { describe, expect, it } from 'vitest';
import type { SpoolDocument, SpoolElement } from '@shared/model/spool';
import {
  buildSpoolPath,
  legLengths,
  type BendSegment,
} from '@/features/sketch/geometry/spool-path';
import { resolveBendRadius, tangentLength } from '@/features/sketch/geometry/pipe-size';
import { add, norm, scale, sub, type Vec3 } from '@/features/sketch/geometry/vec';
import { createSpoolStore } from '@/features/sketch/store/spool-store';

const conditions = { pressure: 300, temperature: 200, material: 'A106-B' };
const close = (a: Vec3, b: Vec3) => expect(norm(sub(a, b))).toBeLessThan(1e-9);
const OD_2IN = 2.375; // ASME B36.10M Table 1: NPS 2 OD 2.375 in

// east 100, north 50, up 30 (leg lengths, intersection to intersection), 2" bends of 3D = 6 in.
const drawnRun = (): SpoolDocument => {
  const store = createSpoolStore({
    units: 'imperial',
    conditions,
    defaultBendRadius: { multipleOfD: 3 },
    elements: [],
  });
  const s = store.getState();
  s.startRun({ nps: '2', schedule: '40' });
  s.addLeg('east', 100);
  s.addLeg('north', 50);
  s.addLeg('up', 30);
  return store.getState().doc;
};

describe('buildSpoolPath', () => {
  it('places every element of a known run (east = +x, north = −z, up = +y)', () => {
    const path = buildSpoolPath(drawnRun());
    const [s1, b1, s2, b2, s3] = path.segments;
    close(s1!.start, { x: 0, y: 0, z: 0 });
    close(s1!.end, { x: 94, y: 0, z: 0 });
    const bend1 = b1 as BendSegment;
    close(bend1.centre, { x: 94, y: 0, z: -6 });
    close(bend1.end, { x: 100, y: 0, z: -6 });
    close(bend1.workPoint!, { x: 100, y: 0, z: 0 });
    close(bend1.dirOut, { x: 0, y: 0, z: -1 });
    close(s2!.end, { x: 100, y: 0, z: -44 });
    close((b2 as BendSegment).centre, { x: 100, y: 6, z: -44 });
    close(s3!.end, { x: 100, y: 30, z: -50 });
    // The free end sits at the sum of the leg lengths.
    close(path.end, { x: 100, y: 30, z: -50 });
    expect(bend1.direction).toBe('north');
  });

  it('developed centreline length = Σ straights + Σ bend arcs R·θ', () => {
    const path = buildSpoolPath(drawnRun());
    // 94 + 38 + 24 straight, two quarter circles of R = 6 in.
    expect(path.developedLength).toBeCloseTo(156 + (2 * (6 * Math.PI)) / 2, 9);
    const arcs = path.segments
      .filter((s): s is BendSegment => s.kind === 'bend')
      .map((b) => b.arcLength);
    expect(arcs).toEqual([3 * Math.PI, 3 * Math.PI]);
  });

  it('leg lengths add the bend tangents back to the cut lengths', () => {
    expect([...legLengths(buildSpoolPath(drawnRun()))]).toEqual([
      ['S1', 100],
      ['S2', 50],
      ['S3', 30],
    ]);
  });

  it('bounding box grows the centreline by half the largest OD', () => {
    const { bbox } = buildSpoolPath(drawnRun());
    const r = OD_2IN / 2;
    close(bbox.min, { x: -r, y: -r, z: -50 - r });
    close(bbox.max, { x: 100 + r, y: 30 + r, z: r });
  });

  it('an empty spool has a unit box at its origin', () => {
    const path = buildSpoolPath({
      units: 'metric',
      conditions,
      origin: { x: 10, y: 0, z: 0 },
      elements: [],
    });
    close(path.bbox.min, { x: 9.5, y: -0.5, z: -0.5 });
    expect(path.developedLength).toBe(0);
  });

  it('a 45° bend turns toward its direction by its angle; the torus frame reproduces both ends', () => {
    const elements: SpoolElement[] = [
      { kind: 'straight', id: 'S1', nps: '4', schedule: '40', length: 50, direction: 'east' },
      {
        kind: 'bend',
        id: 'B1',
        nps: '4',
        schedule: '40',
        bendRadius: 20,
        angle: 45,
        direction: 'north',
      },
      { kind: 'straight', id: 'S2', nps: '4', schedule: '40', length: 10 },
    ];
    const path = buildSpoolPath({ units: 'imperial', conditions, elements });
    const b = path.segments[1] as BendSegment;
    const c = Math.SQRT1_2;
    close(b.dirOut, { x: c, y: 0, z: -c });
    expect(b.direction).toBeUndefined();
    expect(b.angleRad).toBeCloseTo(Math.PI / 4, 12);
    const at = (phi: number) =>
      add(
        b.centre,
        add(scale(b.xAxis, b.radius * Math.cos(phi)), scale(b.yAxis, b.radius * Math.sin(phi))),
      );
    close(at(b.startAngle), b.start);
    close(at(b.endAngle), b.end);
    // Tangent of a 45° bend: R·tan(22.5°).
    expect(b.tangent).toBeCloseTo(20 * Math.tan(Math.PI / 8), 12);
    // The straight after it follows the bend, not an axis.
    close(path.segments[2]!.end, add(b.end, scale({ x: c, y: 0, z: -c }, 10)));
    // The frame is right-handed: normal = x × y.
    expect(norm(b.normal)).toBeCloseTo(1, 12);
  });

  it('metric documents: 3D of NPS 2 = 3 × 50.8 mm (nominal size; common practice "nD" = n × NPS)', () => {
    const bend = {
      kind: 'bend' as const,
      id: 'B1',
      nps: '2',
      schedule: '40',
      bendRadius: { multipleOfD: 3 },
      angle: 90,
    };
    expect(resolveBendRadius(bend, 'metric')).toBeCloseTo(152.4, 9);
    expect(resolveBendRadius(bend, 'imperial')).toBe(6);
    expect(tangentLength(152.4, 90)).toBeCloseTo(152.4, 9);
    expect(tangentLength(10, 180)).toBe(0);
  });

  it('a 180° return bend reverses the run beside itself', () => {
    const elements: SpoolElement[] = [
      { kind: 'straight', id: 'S1', nps: '2', schedule: '40', length: 50, direction: 'east' },
      {
        kind: 'bend',
        id: 'B1',
        nps: '2',
        schedule: '40',
        bendRadius: 5,
        angle: 180,
        direction: 'north',
      },
      { kind: 'straight', id: 'S2', nps: '2', schedule: '40', length: 50 },
    ];
    const path = buildSpoolPath({ units: 'imperial', conditions, elements });
    close(path.segments[1]!.end, { x: 50, y: 0, z: -10 });
    close(path.end, { x: 0, y: 0, z: -10 });
    // The arc bulges 5 in past x = 50: the box includes it.
    expect(path.bbox.max.x).toBeCloseTo(55 + OD_2IN / 2, 6);
  });
});
