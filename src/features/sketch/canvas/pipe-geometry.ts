import {
  BufferAttribute,
  CylinderGeometry,
  TorusGeometry,
  Vector3,
  type BufferGeometry,
} from 'three';

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

/** Fixed light of the sketch in world axes (from above, south-east of the spool). */
export const LIGHT_DIRECTION = new Vector3(0.4, 1, 0.7).normalize();
const AMBIENT = 0.62;
const DIFFUSE = 0.5;

/**
 * Bake diffuse lighting of the fixed world light into a vertex colour (grey scale) of a
 * geometry already placed in world axes. The pipes then draw with an unlit material: the
 * software rasteriser is fill-bound, and an unlit textured fragment is several times cheaper
 * than a lit one. The light does not move with the camera, so the baked shading stays right
 * while orbiting.
 */
export function bakeLighting(g: BufferGeometry): BufferGeometry {
  const normal = g.getAttribute('normal');
  const colors = new Float32Array(normal.count * 3);
  for (let i = 0; i < normal.count; i++) {
    const d =
      normal.getX(i) * LIGHT_DIRECTION.x +
      normal.getY(i) * LIGHT_DIRECTION.y +
      normal.getZ(i) * LIGHT_DIRECTION.z;
    const k = Math.min(1, AMBIENT + DIFFUSE * Math.max(0, d));
    colors[i * 3] = k;
    colors[i * 3 + 1] = k;
    colors[i * 3 + 2] = k;
  }
  g.setAttribute('color', new BufferAttribute(colors, 3));
  return g;
}
