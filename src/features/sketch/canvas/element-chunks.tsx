import { memo, useEffect, useMemo, useRef } from 'react';
import type { ThreeEvent } from '@react-three/fiber';
import { BufferAttribute, BufferGeometry, Matrix4, Quaternion, Vector3 } from 'three';
import type { CheckStatus } from '@shared/engine/types';
import { statusMaterial } from './materials';
import { bakeLighting, createBendGeometry, createStraightGeometry } from './pipe-geometry';
import type { MeshSpec } from './scene-math';

/*
 * Elements are drawn in chunks: consecutive elements (spatially close, since the run is
 * continuous) are merged into one mesh per status, so a sketch of 1,000 elements costs tens
 * of draw calls instead of a thousand. Picking maps the hit triangle back to its element;
 * each chunk's bounding sphere keeps raycasting cheap. An edit rebuilds only the chunks
 * whose elements changed, reusing the cached world geometry of unchanged elements.
 */

/** Elements per chunk. */
export const CHUNK_SIZE = 32;

export interface ChunkItem {
  readonly id: string;
  readonly spec: MeshSpec;
  readonly status: CheckStatus;
}

/** A stable text key of an element's placement and status (chunk memo and geometry cache). */
export function itemKey(item: ChunkItem): string {
  const s = item.spec;
  return `${item.id}|${item.status}|${s.kind}|${s.od}|${s.size}|${s.arc}|${s.position.join(',')}|${s.quaternion.join(',')}`;
}

const m4 = new Matrix4();
const pos = new Vector3();
const quat = new Quaternion();
const one = new Vector3(1, 1, 1);

/** An element's geometry placed in the scene (document units), with baked lighting; `grow` scales the OD. */
export function worldGeometry(spec: MeshSpec, grow = 1): BufferGeometry {
  const od = spec.od * grow;
  const g =
    spec.kind === 'straight'
      ? createStraightGeometry(od, spec.size)
      : createBendGeometry(od, spec.size, spec.arc);
  pos.set(spec.position[0], spec.position[1], spec.position[2]);
  quat.set(spec.quaternion[0], spec.quaternion[1], spec.quaternion[2], spec.quaternion[3]);
  g.applyMatrix4(m4.compose(pos, quat, one));
  return bakeLighting(g);
}

export interface Range {
  readonly id: string;
  /** First triangle index after this element's triangles. */
  readonly endTriangle: number;
}

/** Concatenate indexed position/normal/uv/colour geometries; returns the merged geometry and triangle ranges. */
export function mergeElementGeometries(
  parts: readonly { id: string; geometry: BufferGeometry }[],
): { geometry: BufferGeometry; ranges: Range[] } {
  let vertices = 0;
  let indices = 0;
  for (const p of parts) {
    vertices += p.geometry.getAttribute('position').count;
    indices += p.geometry.getIndex()!.count;
  }
  const position = new Float32Array(vertices * 3);
  const normal = new Float32Array(vertices * 3);
  const uv = new Float32Array(vertices * 2);
  const color = new Float32Array(vertices * 3);
  const index = vertices > 65535 ? new Uint32Array(indices) : new Uint16Array(indices);
  const ranges: Range[] = [];
  let v = 0;
  let i = 0;
  for (const p of parts) {
    const g = p.geometry;
    const n = g.getAttribute('position').count;
    position.set(g.getAttribute('position').array as Float32Array, v * 3);
    normal.set(g.getAttribute('normal').array as Float32Array, v * 3);
    uv.set(g.getAttribute('uv').array as Float32Array, v * 2);
    color.set(g.getAttribute('color').array as Float32Array, v * 3);
    const src = g.getIndex()!.array;
    for (let k = 0; k < src.length; k++) index[i + k] = src[k]! + v;
    v += n;
    i += src.length;
    ranges.push({ id: p.id, endTriangle: i / 3 });
  }
  const merged = new BufferGeometry();
  merged.setAttribute('position', new BufferAttribute(position, 3));
  merged.setAttribute('normal', new BufferAttribute(normal, 3));
  merged.setAttribute('uv', new BufferAttribute(uv, 2));
  merged.setAttribute('color', new BufferAttribute(color, 3));
  merged.setIndex(new BufferAttribute(index, 1));
  merged.computeBoundingSphere();
  merged.computeBoundingBox();
  return { geometry: merged, ranges };
}

/** The element a triangle of a merged geometry belongs to. */
export function elementAtTriangle(ranges: readonly Range[], triangle: number): string | undefined {
  let lo = 0;
  let hi = ranges.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (ranges[mid]!.endTriangle > triangle) hi = mid;
    else lo = mid + 1;
  }
  const r = ranges[lo];
  return r && triangle < r.endTriangle ? r.id : undefined;
}

export interface ElementChunkProps {
  readonly items: readonly ChunkItem[];
  /** Joined item keys: the chunk rebuilds only when this changes. */
  readonly chunkKey: string;
  readonly onSelect: (id: string) => void;
  readonly onHover: (id: string | null) => void;
}

function ElementChunkImpl({ items, onSelect, onHover }: ElementChunkProps) {
  // World geometry per element key, kept between rebuilds of this chunk.
  const cache = useRef(new Map<string, BufferGeometry>());
  const groups = useMemo(() => {
    const next = new Map<string, BufferGeometry>();
    const byStatus = new Map<CheckStatus, { id: string; geometry: BufferGeometry }[]>();
    for (const item of items) {
      const key = itemKey(item);
      const geometry = cache.current.get(key) ?? worldGeometry(item.spec);
      next.set(key, geometry);
      const list = byStatus.get(item.status) ?? [];
      list.push({ id: item.id, geometry });
      byStatus.set(item.status, list);
    }
    for (const [key, g] of cache.current) if (!next.has(key)) g.dispose();
    cache.current = next;
    return [...byStatus].map(([status, parts]) => ({ status, ...mergeElementGeometries(parts) }));
  }, [items]);
  useEffect(() => () => groups.forEach((g) => g.geometry.dispose()), [groups]);
  useEffect(
    () => () => {
      for (const g of cache.current.values()) g.dispose();
      cache.current.clear();
    },
    [],
  );

  return (
    <group>
      {groups.map(({ status, geometry, ranges }) => {
        const idOf = (e: ThreeEvent<PointerEvent | MouseEvent>) =>
          e.faceIndex == null ? undefined : elementAtTriangle(ranges, e.faceIndex);
        return (
          <mesh
            key={status}
            geometry={geometry}
            material={statusMaterial(status)}
            userData={{ elementRanges: ranges }}
            onClick={(e: ThreeEvent<MouseEvent>) => {
              const id = idOf(e);
              if (!id) return;
              e.stopPropagation();
              onSelect(id);
            }}
            onPointerMove={(e: ThreeEvent<PointerEvent>) => {
              const id = idOf(e);
              if (!id) return;
              e.stopPropagation();
              onHover(id);
            }}
            onPointerOut={() => onHover(null)}
          />
        );
      })}
    </group>
  );
}

/** A chunk of consecutive elements, merged per status. */
export const ElementChunk = memo(
  ElementChunkImpl,
  (a, b) => a.chunkKey === b.chunkKey && a.onSelect === b.onSelect && a.onHover === b.onHover,
);
