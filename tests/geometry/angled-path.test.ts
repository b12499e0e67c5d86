import { describe, expect, it } from 'vitest';
import { Matrix4, Quaternion, Vector3 } from 'three';
import type { SpoolDocument } from '@shared/model/spool';
import { angledDirection } from '@/features/sketch/geometry/angled-direction';
import {
  buildSpoolPath,
  legLengths,
  type BendSegment,
} from '@/features/sketch/geometry/spool-path';
import {
  add,
  angleBetweenDeg,
  cross,
  dot,
  norm,
  scale,
  sub,
  vec,
  type Vec3,
} from '@/features/sketch/geometry/vec';
import { dimensionText } from '@/features/sketch/canvas/dimension-labels';
import { meshSpecOf } from '@/features/sketch/canvas/scene-math';
import { createSpoolStore } from '@/features/sketch/store/spool-store';

const conditions = { pressure: 300, temperature: 200, material: 'A106-B' };
const close = (a: Vec3, b: Vec3, tol = 1e-5) => expect(norm(sub(a, b))).toBeLessThan(tol);
// NPS 2, 3D bends: R = 3 × 2 in = 6 in (common practice "nD" = n × NPS).
const R = 6;
const T45 = R * Math.tan(Math.PI / 8); // R·tan(θ/2) for 45° = 2.485281 in
const S = Math.SQRT1_2;

function drawn(
  legs: [
    Parameters<ReturnType<ReturnType<typeof createSpoolStore>['getState']>['addLeg']>[0],
    number,
  ][],
): SpoolDocument {
  const store = createSpoolStore({
    units: 'imperial',
    conditions,
    defaultBendRadius: { multipleOfD: 3 },
    elements: [],
  });
  store.getState().startRun({ nps: '2', schedule: '40' });
  for (const [d, l] of legs) {
    const r = store.getState().addLeg(d, l);
    if (!r.ok) throw new Error(r.message);
  }
  return store.getState().doc;
}
const h = (i: Parameters<typeof angledDirection>[0]) => {
  const r = angledDirection(i);
  if (!r.ok) throw new Error('bad');
  return r.heading;
};

describe('any-angle paths', () => {
  it('places a 45° offset: work points at the leg lengths, free end at 100 + 50·cos45 + 100 east', () => {
    const path = buildSpoolPath(
      drawn([
        ['east', 100],
        [h({ from: 'east', toward: 'north', angle: 45 }), 50],
        ['east', 100],
      ]),
    );
    const [s1, b1, s2, b2, s3] = path.segments;
    close(s1!.end, vec(100 - T45, 0, 0));
    const bend1 = b1 as BendSegment;
    close(bend1.workPoint!, vec(100, 0, 0));
    close(bend1.centre, vec(100 - T45, 0, -R)); // north = −z
    close(bend1.dirOut, vec(S, 0, -S));
    close(s2!.start, add(vec(100, 0, 0), scale(vec(S, 0, -S), T45)));
    const bend2 = b2 as BendSegment;
    close(bend2.workPoint!, vec(100 + 50 * S, 0, -50 * S)); // (135.355, 0, −35.355)
    close(s3!.end, vec(200 + 50 * S, 0, -50 * S)); // (235.355, 0, −35.355)
    close(path.end, vec(200 + 50 * S, 0, -50 * S));
    expect(bend1.angleDeg).toBe(45);
    expect(bend2.angleDeg).toBe(45);
    // Leg labels: the offset leg is 50 in intersection to intersection.
    expect(legLengths(path).get(s2!.id)).toBeCloseTo(50, 5);
    expect(dimensionText(bend1, 'imperial')).toBe('45° R6 in');
  });

  it('gives the developed length of the offset: Σ cut lengths + Σ R·θ', () => {
    const path = buildSpoolPath(
      drawn([
        ['east', 100],
        [h({ from: 'east', toward: 'north', angle: 45 }), 50],
        ['east', 100],
      ]),
    );
    // cuts: (100 − T45) + (50 − 2·T45) + (100 − T45) = 240.058875; arcs: 2 × 6 × π/4 = 9.424778
    const expected = 250 - 4 * T45 + 2 * R * (Math.PI / 4);
    expect(path.developedLength).toBeCloseTo(expected, 5);
    expect(path.developedLength).toBeCloseTo(249.483653, 5);
  });

  it('draws a rolled bend on a torus in the plane of its two legs', () => {
    const rolled = h({ from: 'east', toward: 'north', angle: 45, rollToward: 'up', roll: 30 });
    const path = buildSpoolPath(
      drawn([
        ['east', 80],
        [rolled, 60],
      ]),
    );
    const bend = path.segments[1] as BendSegment;
    const dirIn = vec(1, 0, 0);
    const want = vec(S, S * 0.5, -S * Math.cos(Math.PI / 6));
    close(bend.dirOut, want, 1e-9);
    expect(angleBetweenDeg(bend.dirIn, bend.dirOut)).toBeCloseTo(45, 9);
    // The bend plane's normal is square to both legs and not an axis (it is rolled).
    expect(Math.abs(dot(bend.normal, dirIn))).toBeLessThan(1e-9);
    expect(Math.abs(dot(bend.normal, bend.dirOut))).toBeLessThan(1e-9);
    expect(Math.abs(bend.normal.y)).toBeGreaterThan(0.1);
    expect(Math.abs(bend.normal.z)).toBeGreaterThan(0.1);
    // The torus placed as the canvas places it starts at the tangent point and ends at the other.
    const spec = meshSpecOf(bend);
    const m = new Matrix4().compose(
      new Vector3(...spec.position),
      new Quaternion(...spec.quaternion),
      new Vector3(1, 1, 1),
    );
    const onTorus = (phi: number) =>
      new Vector3(spec.size * Math.cos(phi), spec.size * Math.sin(phi), 0).applyMatrix4(m);
    const p0 = onTorus(0);
    const p1 = onTorus(spec.arc);
    close(vec(p0.x, p0.y, p0.z), bend.start);
    close(vec(p1.x, p1.y, p1.z), bend.end);
    // End point lies on the work line: work point + T45 along the new leg.
    close(bend.end, add(bend.workPoint!, scale(want, T45)));
    expect(norm(cross(sub(bend.end, bend.start), bend.normal))).toBeGreaterThan(0);
  });

  it('keeps the axis-only path of an old document unchanged', () => {
    const old: SpoolDocument = {
      units: 'imperial',
      conditions,
      elements: [
        { kind: 'straight', id: 'S1', nps: '2', schedule: '40', length: 94, direction: 'east' },
        {
          kind: 'bend',
          id: 'B1',
          nps: '2',
          schedule: '40',
          bendRadius: { multipleOfD: 3 },
          angle: 90,
          direction: 'north',
        },
        { kind: 'straight', id: 'S2', nps: '2', schedule: '40', length: 44, direction: 'north' },
      ],
    };
    const path = buildSpoolPath(old);
    close(path.end, vec(100, 0, -50));
  });
});

describe('fitting the view', () => {
  it('fits a tall spool whole at 1280 × 800 with a margin (box corners projected isometrically)', async () => {
    const { fitOrthographic, fitMargin } = await import('@/features/sketch/canvas/scene-math');
    const { ISOMETRIC_VIEW } = await import('@/features/sketch/canvas/view-controller');
    // A riser: 24 in east, 1200 in up, 24 in north.
    const doc = drawn([
      ['east', 24],
      ['up', 1200],
      ['north', 24],
    ]);
    const path = buildSpoolPath(doc);
    const W = 1280;
    const H = 800;
    const iso = vec(ISOMETRIC_VIEW.x, ISOMETRIC_VIEW.y, ISOMETRIC_VIEW.z);
    const f = fitOrthographic(path.bbox.min, path.bbox.max, iso, W, H);
    const m = fitMargin(W, H);
    expect(m).toBe(48); // 6 % of 800 px
    // Project every corner as the camera does (view-plane axes x = up × z, y = z × x).
    const z = iso;
    const x = (() => {
      const c = cross(vec(0, 1, 0), z);
      return scale(c, 1 / norm(c));
    })();
    const y = cross(z, x);
    const t = vec(f.target.x, f.target.y, f.target.z);
    for (const cx of [path.bbox.min.x, path.bbox.max.x])
      for (const cy of [path.bbox.min.y, path.bbox.max.y])
        for (const cz of [path.bbox.min.z, path.bbox.max.z]) {
          const d = sub(vec(cx, cy, cz), t);
          const sx = W / 2 + dot(d, x) * f.zoom;
          const sy = H / 2 - dot(d, y) * f.zoom;
          expect(sx).toBeGreaterThanOrEqual(m - 1e-6);
          expect(sx).toBeLessThanOrEqual(W - m + 1e-6);
          expect(sy).toBeGreaterThanOrEqual(m - 1e-6);
          expect(sy).toBeLessThanOrEqual(H - m + 1e-6);
        }
    // The height governs: the projected height fills the usable 704 px exactly.
    expect(f.extent.h * f.zoom).toBeCloseTo(H - 2 * m, 6);
  });
});

describe('dimension labels in display units', () => {
  it('shows an imperial offset in mm when the display is metric (1 in = 25.4 mm, exact)', () => {
    const path = buildSpoolPath(
      drawn([
        ['east', 100],
        [h({ from: 'east', toward: 'north', angle: 45 }), 50],
      ]),
    );
    const [s1, b1] = path.segments;
    expect(dimensionText(b1!, 'imperial', undefined, 'metric')).toBe('45° R152.4 mm');
    // S1: cut 100 − 2.485281 = 97.514719 in = 2476.87 mm; leg 100 in = 2540 mm
    expect(dimensionText(s1!, 'imperial', 100, 'metric')).toBe('2476.87 mm · leg 2540');
  });
});
