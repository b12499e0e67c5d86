import type { Bend, Direction, SpoolDocument, SpoolElement, Straight } from '@shared/model/spool';
import { bendTangent, drawnOutsideDiameter, resolveBendRadius } from './pipe-size';
import {
  DIRECTION_VECTORS,
  add,
  angleBetweenDeg,
  cross,
  directionOf,
  dot,
  elementDirection,
  norm,
  normalize,
  scale,
  sub,
  vec,
  type Vec3,
} from './vec';

/*
 * Model → path. Conventions (shared with the editor store):
 * - Scene axes: east = +x, up = +y, north = −z (so south = +z, west = −x, down = −y).
 * - Points are in document length units (in | mm); the canvas scales them.
 * - A straight's `length` is its cut length: the straight pipe between the tangent points of
 *   the bends at its ends. The centreline walks straight by straight and arc by arc, so the
 *   developed centreline length is Σ straight lengths + Σ bend arc lengths R·θ.
 * - A leg is a run of straights in one direction between two direction changes; its work
 *   length (centreline intersection to intersection, or to the run's free end) is the sum of
 *   its straights plus the tangent R·tan(θ/2) of each bend at its ends.
 * - Direction: a straight that follows a bend runs along the bend's outgoing direction; a
 *   straight that starts the run or follows a straight runs along its own `heading` or
 *   `direction` (default: the current direction; the run starts east). A bend turns the
 *   incoming direction u toward its `heading`/`direction` h by its `angle`, in the plane of
 *   u and h (90° between perpendicular axes lands on that axis; 45° with h at 45° to u lands
 *   on h). Any angle and plane: the bend's torus frame follows.
 */

export interface StraightSegment {
  readonly kind: 'straight';
  readonly id: string;
  readonly index: number;
  readonly element: Straight;
  readonly start: Vec3;
  readonly end: Vec3;
  /** Unit run direction. */
  readonly dir: Vec3;
  /** Axis name of `dir`, when axis-aligned. */
  readonly direction: Direction | undefined;
  /** Cut length (document units). */
  readonly length: number;
  readonly outsideDiameter: number;
  /** Where a dimension label sits: the mid-point, offset sideways by one OD. */
  readonly labelAnchor: Vec3;
  readonly midpoint: Vec3;
}

export interface BendSegment {
  readonly kind: 'bend';
  readonly id: string;
  readonly index: number;
  readonly element: Bend;
  /** Tangent point where the bend starts / ends. */
  readonly start: Vec3;
  readonly end: Vec3;
  readonly dirIn: Vec3;
  readonly dirOut: Vec3;
  readonly direction: Direction | undefined;
  /** Centre of curvature and centreline radius R1 (document units). */
  readonly centre: Vec3;
  readonly radius: number;
  /** Bend angle (degrees and radians). */
  readonly angleDeg: number;
  readonly angleRad: number;
  /**
   * Plane of the bend as an orthonormal frame at `centre`: `xAxis` points from the centre to
   * `start`, `yAxis` is `dirIn`, `normal` = xAxis × yAxis. The centreline point at
   * φ ∈ [startAngle, endAngle] is centre + R·(cos φ·xAxis + sin φ·yAxis); a three.js
   * TorusGeometry(R, r, …, arc = angleRad) placed with Matrix4.makeBasis(xAxis, yAxis, normal)
   * at `centre` is exactly this segment.
   */
  readonly xAxis: Vec3;
  readonly yAxis: Vec3;
  readonly normal: Vec3;
  readonly startAngle: number;
  readonly endAngle: number;
  /** Centreline arc length R·θ. */
  readonly arcLength: number;
  /** R·tan(θ/2), the tangent need at each end (0 for 180°). */
  readonly tangent: number;
  /** Intersection of the two leg centrelines (start + dirIn·tangent); undefined for 180°. */
  readonly workPoint: Vec3 | undefined;
  readonly outsideDiameter: number;
  readonly midpoint: Vec3;
  readonly labelAnchor: Vec3;
}

export type PathSegment = StraightSegment | BendSegment;

export interface BoundingBox {
  readonly min: Vec3;
  readonly max: Vec3;
}

export interface SpoolPath {
  readonly segments: readonly PathSegment[];
  readonly byId: ReadonlyMap<string, PathSegment>;
  /** Start of the run (the document origin) and the free end after the last element. */
  readonly start: Vec3;
  readonly end: Vec3;
  /** Direction at the free end. */
  readonly endDir: Vec3;
  /** Σ straight lengths + Σ bend arcs (document units). */
  readonly developedLength: number;
  /** Box around every centreline point grown by half the largest OD; a unit box at the origin when empty. */
  readonly bbox: BoundingBox;
  /** Notes about document directions that could not be honoured (e.g. a bend with no usable direction). */
  readonly notes: readonly string[];
}

const EAST = DIRECTION_VECTORS.east;

/** Any unit vector perpendicular to u, preferring up, then north. */
function perpendicularTo(u: Vec3): Vec3 {
  const up = DIRECTION_VECTORS.up;
  if (Math.abs(dot(u, up)) < 0.9) return normalize(sub(up, scale(u, dot(up, u))));
  const n = DIRECTION_VECTORS.north;
  return normalize(sub(n, scale(u, dot(n, u))));
}

/** Initial direction of a run: the first element's direction, with a leading bend's incoming direction made perpendicular. */
function initialDirection(elements: readonly SpoolElement[]): Vec3 {
  const first = elements[0];
  const d = first ? elementDirection(first) : undefined;
  if (!d) return EAST;
  if (first?.kind === 'straight') return d;
  // A bend starts the run: come in perpendicular to where it turns.
  return Math.abs(dot(d, EAST)) < 0.5 ? EAST : DIRECTION_VECTORS.north;
}

/** The incoming direction of every element and the direction it leaves in. */
export interface ElementDirections {
  readonly dirIn: Vec3;
  readonly dirOut: Vec3;
}

/** Bend turn target projected into the plane perpendicular to u; a fallback when unusable. */
function bendTarget(u: Vec3, bend: Bend, next: SpoolElement | undefined, notes: string[]): Vec3 {
  const candidates: (Vec3 | undefined)[] = [
    elementDirection(bend),
    next?.kind === 'straight' ? elementDirection(next) : undefined,
  ];
  for (const t of candidates) {
    if (!t) continue;
    const perp = sub(t, scale(u, dot(t, u)));
    if (norm(perp) > 1e-6) return normalize(perp);
  }
  notes.push(
    `bend ${bend.id}: no direction that turns the run; drawn turning ${bend.direction === 'up' ? 'sideways' : 'upward'}`,
  );
  return perpendicularTo(u);
}

/** Build the centreline path of a spool document (see the conventions above). */
export function buildSpoolPath(doc: SpoolDocument): SpoolPath {
  const units = doc.units;
  const origin = doc.origin ? vec(doc.origin.x, doc.origin.y, doc.origin.z) : vec(0, 0, 0);
  const notes: string[] = [];
  const segments: PathSegment[] = [];
  const byId = new Map<string, PathSegment>();
  let cur = initialDirection(doc.elements);
  let p = origin;
  let developed = 0;
  let maxOd = 0;
  const min = { x: origin.x, y: origin.y, z: origin.z };
  const max = { x: origin.x, y: origin.y, z: origin.z };
  const grow = (q: Vec3) => {
    min.x = Math.min(min.x, q.x);
    min.y = Math.min(min.y, q.y);
    min.z = Math.min(min.z, q.z);
    max.x = Math.max(max.x, q.x);
    max.y = Math.max(max.y, q.y);
    max.z = Math.max(max.z, q.z);
  };

  doc.elements.forEach((el, index) => {
    const od = drawnOutsideDiameter(el, units);
    maxOd = Math.max(maxOd, od);
    const prev = index > 0 ? doc.elements[index - 1] : undefined;
    if (el.kind === 'straight') {
      const own = prev?.kind !== 'bend' ? elementDirection(el) : undefined;
      const dir = own ?? cur;
      const end = add(p, scale(dir, el.length));
      const midpoint = add(p, scale(dir, el.length / 2));
      const side = perpendicularTo(dir);
      const seg: StraightSegment = {
        kind: 'straight',
        id: el.id,
        index,
        element: el,
        start: p,
        end,
        dir,
        direction: directionOf(dir),
        length: el.length,
        outsideDiameter: od,
        midpoint,
        labelAnchor: add(midpoint, scale(side, od)),
      };
      segments.push(seg);
      byId.set(el.id, seg);
      developed += el.length;
      grow(end);
      p = end;
      cur = dir;
      return;
    }
    const u = cur;
    const t = bendTarget(u, el, doc.elements[index + 1], notes);
    const theta = (el.angle * Math.PI) / 180;
    const radius = resolveBendRadius(el, units);
    const centre = add(p, scale(t, radius));
    const xAxis = scale(t, -1);
    const yAxis = u;
    const normal = cross(xAxis, yAxis);
    const at = (phi: number) =>
      add(centre, add(scale(xAxis, radius * Math.cos(phi)), scale(yAxis, radius * Math.sin(phi))));
    const end = at(theta);
    const dirOut = normalize(add(scale(u, Math.cos(theta)), scale(t, Math.sin(theta))));
    const tangent = bendTangent(el, units);
    const midpoint = at(theta / 2);
    const outward = normalize(sub(midpoint, centre));
    const seg: BendSegment = {
      kind: 'bend',
      id: el.id,
      index,
      element: el,
      start: p,
      end,
      dirIn: u,
      dirOut,
      direction: directionOf(dirOut),
      centre,
      radius,
      angleDeg: el.angle,
      angleRad: theta,
      xAxis,
      yAxis,
      normal,
      startAngle: 0,
      endAngle: theta,
      arcLength: radius * theta,
      tangent,
      workPoint: el.angle < 180 - 1e-9 ? add(p, scale(u, tangent)) : undefined,
      outsideDiameter: od,
      midpoint,
      labelAnchor: add(midpoint, scale(outward, od)),
    };
    segments.push(seg);
    byId.set(el.id, seg);
    developed += radius * theta;
    // The arc bulges past its end points for angles over 90°: sample it for the box.
    for (let k = 1; k <= 8; k++) grow(at((theta * k) / 8));
    p = end;
    cur = dirOut;
  });

  const half = maxOd > 0 ? maxOd / 2 : 0;
  const box: BoundingBox =
    segments.length === 0
      ? { min: sub(origin, vec(0.5, 0.5, 0.5)), max: add(origin, vec(0.5, 0.5, 0.5)) }
      : {
          min: vec(min.x - half, min.y - half, min.z - half),
          max: vec(max.x + half, max.y + half, max.z + half),
        };
  return {
    segments,
    byId,
    start: origin,
    end: p,
    endDir: cur,
    developedLength: developed,
    bbox: box,
    notes,
  };
}

/**
 * Box around one element: its centreline (a bend's arc sampled) grown by one outside
 * diameter on every side, so a focused element keeps a little of its surroundings.
 */
export function segmentBox(seg: PathSegment): BoundingBox {
  const pts: Vec3[] = [seg.start, seg.end];
  if (seg.kind === 'bend') {
    for (let k = 1; k < 8; k++) {
      const phi = (seg.angleRad * k) / 8;
      pts.push(
        add(
          seg.centre,
          add(
            scale(seg.xAxis, seg.radius * Math.cos(phi)),
            scale(seg.yAxis, seg.radius * Math.sin(phi)),
          ),
        ),
      );
    }
  }
  const g = seg.outsideDiameter;
  const lo = (f: (v: Vec3) => number) => Math.min(...pts.map(f)) - g;
  const hi = (f: (v: Vec3) => number) => Math.max(...pts.map(f)) + g;
  return {
    min: vec(
      lo((v) => v.x),
      lo((v) => v.y),
      lo((v) => v.z),
    ),
    max: vec(
      hi((v) => v.x),
      hi((v) => v.y),
      hi((v) => v.z),
    ),
  };
}

/** Centre and size of a box. */
export function boxCentre(box: BoundingBox): Vec3 {
  return scale(add(box.min, box.max), 0.5);
}
export function boxSize(box: BoundingBox): Vec3 {
  return sub(box.max, box.min);
}

/** Angle between two directions in degrees (re-exported for the store's turn checks). */
export { angleBetweenDeg };

/**
 * Leg length (centreline intersection to intersection, or to the run's free end) of the leg
 * each straight belongs to: its straights' cut lengths plus the tangent of the bend at each
 * end of the leg. Keys are straight ids.
 */
export function legLengths(path: SpoolPath): Map<string, number> {
  const out = new Map<string, number>();
  const segs = path.segments;
  let i = 0;
  while (i < segs.length) {
    const first = segs[i]!;
    if (first.kind !== 'straight') {
      i++;
      continue;
    }
    let j = i;
    let sum = 0;
    while (j < segs.length) {
      const s = segs[j]!;
      if (s.kind !== 'straight' || (j > i && dot(s.dir, first.dir) < 1 - 1e-9)) break;
      sum += s.length;
      j++;
    }
    const before = segs[i - 1];
    const after = segs[j];
    if (before?.kind === 'bend') sum += before.tangent;
    if (after?.kind === 'bend') sum += after.tangent;
    for (let k = i; k < j; k++) out.set(segs[k]!.id, sum);
    i = j;
  }
  return out;
}
