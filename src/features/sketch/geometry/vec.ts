import type { Direction, Heading } from '@shared/model/spool';

/** A plain 3D vector in scene axes: east = +x, up = +y, north = −z (south = +z). */
export interface Vec3 {
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

export const vec = (x: number, y: number, z: number): Vec3 => ({ x, y, z });
export const add = (a: Vec3, b: Vec3): Vec3 => vec(a.x + b.x, a.y + b.y, a.z + b.z);
export const sub = (a: Vec3, b: Vec3): Vec3 => vec(a.x - b.x, a.y - b.y, a.z - b.z);
export const scale = (a: Vec3, k: number): Vec3 => vec(a.x * k, a.y * k, a.z * k);
export const dot = (a: Vec3, b: Vec3): number => a.x * b.x + a.y * b.y + a.z * b.z;
export const cross = (a: Vec3, b: Vec3): Vec3 =>
  vec(a.y * b.z - a.z * b.y, a.z * b.x - a.x * b.z, a.x * b.y - a.y * b.x);
export const norm = (a: Vec3): number => Math.hypot(a.x, a.y, a.z);
export const normalize = (a: Vec3): Vec3 => {
  const n = norm(a);
  return n === 0 ? a : scale(a, 1 / n);
};
/** Angle between two vectors, degrees (0…180); atan2 keeps it exact near 0° and 180°. */
export const angleBetweenDeg = (a: Vec3, b: Vec3): number => {
  const u = normalize(a);
  const v = normalize(b);
  return (Math.atan2(norm(cross(u, v)), dot(u, v)) * 180) / Math.PI;
};

/** Unit vector of each sketch direction (east = +x, up = +y, north = −z). */
export const DIRECTION_VECTORS: Readonly<Record<Direction, Vec3>> = {
  east: vec(1, 0, 0),
  west: vec(-1, 0, 0),
  up: vec(0, 1, 0),
  down: vec(0, -1, 0),
  north: vec(0, 0, -1),
  south: vec(0, 0, 1),
};

export const OPPOSITE_DIRECTION: Readonly<Record<Direction, Direction>> = {
  east: 'west',
  west: 'east',
  up: 'down',
  down: 'up',
  north: 'south',
  south: 'north',
};

/** The axis direction a unit vector points along, or undefined when it is not axis-aligned. */
export function directionOf(v: Vec3, tolerance = 1e-6): Direction | undefined {
  for (const [name, d] of Object.entries(DIRECTION_VECTORS) as [Direction, Vec3][]) {
    if (norm(sub(normalize(v), d)) < tolerance) return name;
  }
  return undefined;
}

/** A document heading (east, north, up components) as a unit scene vector. */
export function headingToVec(h: Heading): Vec3 {
  return normalize(vec(h.east, h.up, -h.north));
}

const clean = (v: number) => {
  const r = Math.round(v * 1e12) / 1e12;
  return r === 0 ? 0 : r;
};

/** A scene vector as a document heading (unit length, components rounded to 1e-12). */
export function vecToHeading(v: Vec3): Heading {
  const u = normalize(v);
  return { east: clean(u.x), north: clean(-u.z), up: clean(u.y) };
}

/** The unit direction an element states: its `heading`, else its axis `direction`, else undefined. */
export function elementDirection(el: {
  heading?: Heading;
  direction?: Direction;
}): Vec3 | undefined {
  if (el.heading) return headingToVec(el.heading);
  return el.direction ? DIRECTION_VECTORS[el.direction] : undefined;
}
