import { Matrix4, Quaternion, Vector3 } from 'three';
import type { PathSegment } from '../geometry/spool-path';
import type { Vec3 } from '../geometry/vec';

/** Placement of one element's mesh: geometry parameters and a pose (document units). */
export interface MeshSpec {
  readonly kind: 'straight' | 'bend';
  readonly od: number;
  /** Straights: length; bends: centreline radius. */
  readonly size: number;
  /** Bends: arc in radians (0 for straights). */
  readonly arc: number;
  readonly position: readonly [number, number, number];
  readonly quaternion: readonly [number, number, number, number];
}

const Y = new Vector3(0, 1, 0);
const toV = (v: Vec3) => new Vector3(v.x, v.y, v.z);

/** Quaternion turning +y onto a unit direction. */
export function quaternionAlong(dir: Vec3): [number, number, number, number] {
  const q = new Quaternion().setFromUnitVectors(Y, toV(dir).normalize());
  return [q.x, q.y, q.z, q.w];
}

/** The mesh placement of a path segment (straights: a +y cylinder at the mid-point; bends: the torus frame at the centre). */
export function meshSpecOf(seg: PathSegment): MeshSpec {
  if (seg.kind === 'straight') {
    return {
      kind: 'straight',
      od: seg.outsideDiameter,
      size: seg.length,
      arc: 0,
      position: [seg.midpoint.x, seg.midpoint.y, seg.midpoint.z],
      quaternion: quaternionAlong(seg.dir),
    };
  }
  const m = new Matrix4().makeBasis(toV(seg.xAxis), toV(seg.yAxis), toV(seg.normal));
  const q = new Quaternion().setFromRotationMatrix(m);
  return {
    kind: 'bend',
    od: seg.outsideDiameter,
    size: seg.radius,
    arc: seg.angleRad,
    position: [seg.centre.x, seg.centre.y, seg.centre.z],
    quaternion: [q.x, q.y, q.z, q.w],
  };
}

/** Equal placements (for React.memo). */
export function sameSpec(a: MeshSpec, b: MeshSpec): boolean {
  return (
    a.kind === b.kind &&
    a.od === b.od &&
    a.size === b.size &&
    a.arc === b.arc &&
    a.position.every((v, i) => v === b.position[i]) &&
    a.quaternion.every((v, i) => v === b.quaternion[i])
  );
}

/** Scene units per document length unit: the scene is in inches (metric documents are scaled by 1/25.4). */
export function sceneScale(units: 'imperial' | 'metric'): number {
  return units === 'metric' ? 1 / 25.4 : 1;
}

/** A round step (1, 2, 5 × 10ⁿ) near `raw`. */
export function niceStep(raw: number): number {
  if (!(raw > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(raw));
  const f = raw / p;
  return (f < 1.5 ? 1 : f < 3.5 ? 2 : f < 7.5 ? 5 : 10) * p;
}

/** How an orthographic view frames a box: where it looks, its zoom (pixels per scene unit) and the box's projected size. */
export interface OrthographicFit {
  readonly target: Vector3;
  readonly zoom: number;
  /** Width and height of the box projected on the view plane (scene units). */
  readonly extent: { readonly w: number; readonly h: number };
}

/** Margin left around a fitted box on each side: 6 % of the shorter side, at least 24 px. */
export function fitMargin(width: number, height: number): number {
  return Math.max(24, 0.06 * Math.min(width, height));
}

/**
 * Frame a box (scene units) in an orthographic view looking along −`viewDir` with `up` as
 * the screen's up, in a viewport of `width` × `height` px: the box's eight corners are
 * projected on the view plane, so a tall spool seen from the isometric direction keeps its
 * full projected height, and the zoom leaves `margin` px free on every side.
 */
export function fitOrthographic(
  min: Vec3,
  max: Vec3,
  viewDir: Vec3,
  width: number,
  height: number,
  up: Vec3 = { x: 0, y: 1, z: 0 },
  margin: number = fitMargin(width, height),
): OrthographicFit {
  const z = toV(viewDir).normalize();
  const x = toV(up).cross(z).normalize();
  const y = z.clone().cross(x);
  const target = toV(min).add(toV(max)).multiplyScalar(0.5);
  let w = 0;
  let h = 0;
  for (const cx of [min.x, max.x])
    for (const cy of [min.y, max.y])
      for (const cz of [min.z, max.z]) {
        const d = new Vector3(cx, cy, cz).sub(target);
        w = Math.max(w, Math.abs(d.dot(x)) * 2);
        h = Math.max(h, Math.abs(d.dot(y)) * 2);
      }
  const usableW = Math.max(1, width - 2 * margin);
  const usableH = Math.max(1, height - 2 * margin);
  const zoom = Math.max(1e-4, Math.min(usableW / Math.max(w, 1e-6), usableH / Math.max(h, 1e-6)));
  return { target, zoom, extent: { w, h } };
}
