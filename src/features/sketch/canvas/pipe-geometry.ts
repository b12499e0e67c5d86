import { CylinderGeometry, TorusGeometry, type BufferGeometry } from 'three';

/*
 * Low-polygon pipe geometry: software WebGL is vertex-bound, so pipes use few radial segments.
 * UVs are rewritten so u runs around the pipe (3 tiles per turn) and v along it (one tile per
 * outside diameter), the convention of the status pattern textures.
 */

/** Radial segments of every pipe. */
export const RADIAL_SEGMENTS = 8;
/** Degrees of arc per torus segment (at least 2 segments per bend). */
const DEGREES_PER_SEGMENT = 22.5;
const AROUND_TILES = 3;

/** An open tube of outside diameter `od` and `length` along +y, centred at the origin. */
export function createStraightGeometry(od: number, length: number): BufferGeometry {
  const g = new CylinderGeometry(od / 2, od / 2, length, RADIAL_SEGMENTS, 1, true);
  const uv = g.getAttribute('uv');
  const along = length / od;
  for (let i = 0; i < uv.count; i++) uv.setXY(i, uv.getX(i) * AROUND_TILES, uv.getY(i) * along);
  uv.needsUpdate = true;
  return g;
}

/**
 * A torus segment: centreline radius `radius`, tube outside diameter `od`, from angle 0 (on +x)
 * turning toward +y by `arc` radians, in the xy plane (the frame of `BendSegment`).
 */
export function createBendGeometry(od: number, radius: number, arc: number): BufferGeometry {
  const tubular = Math.max(2, Math.ceil((arc * 180) / Math.PI / DEGREES_PER_SEGMENT));
  const g = new TorusGeometry(radius, od / 2, RADIAL_SEGMENTS, tubular, arc);
  const uv = g.getAttribute('uv');
  const along = (radius * arc) / od;
  // TorusGeometry: u = along the arc, v = around the tube; swap to the shared convention.
  for (let i = 0; i < uv.count; i++) {
    const u = uv.getX(i);
    const v = uv.getY(i);
    uv.setXY(i, v * AROUND_TILES, u * along);
  }
  uv.needsUpdate = true;
  return g;
}
