import type { Direction } from '@shared/model/spool';

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
/** Angle between two vectors, degrees (0…180). */
export const angleBetweenDeg = (a: Vec3, b: Vec3): number => {
  const c = dot(normalize(a), normalize(b));
  return (Math.acos(Math.min(1, Math.max(-1, c))) * 180) / Math.PI;
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
