import { useLayoutEffect, useMemo, useRef } from 'react';
import {
  BufferAttribute,
  BufferGeometry,
  CircleGeometry,
  CylinderGeometry,
  DoubleSide,
  LineBasicMaterial,
  MeshLambertMaterial,
  Object3D,
  TorusGeometry,
  type InstancedMesh,
  type Material,
} from 'three';
import type { PathSegment } from '../geometry/spool-path';
import { add, cross, normalize, scale, sub, dot, type Vec3 } from '../geometry/vec';
import { quaternionAlong } from './scene-math';

/*
 * Marks at element ends, our own simple symbols:
 * - weld: a dark bead ring where two straights meet;
 * - tangent: a thin light ring line where a straight meets a bend (the tangent point);
 * - open end: a flat dark disc on a plain free end of the run;
 * - bevel: a short grey cone on a bevelled free end;
 * - threaded: three thin dark ring lines near the end of a threaded straight;
 * - grooved: one wider dark ring line a little in from the end of a grooved straight.
 * Each kind is one InstancedMesh or one line set, so the marks add a handful of draw calls at any size.
 */
export type MarkerKind = 'weld' | 'tangent' | 'open' | 'bevel' | 'thread' | 'groove';

export interface Marker {
  readonly kind: MarkerKind;
  readonly at: Vec3;
  /** Unit direction pointing out of the element at this end. */
  readonly dir: Vec3;
  readonly od: number;
}

/** The end marks of a path. */
export function computeMarkers(segments: readonly PathSegment[]): Marker[] {
  const out: Marker[] = [];
  segments.forEach((seg, i) => {
    const prev = segments[i - 1];
    const next = segments[i + 1];
    if (seg.kind === 'straight') {
      const od = seg.outsideDiameter;
      const back = scale(seg.dir, -1);
      if (prev?.kind === 'straight')
        out.push({
          kind: 'weld',
          at: seg.start,
          dir: back,
          od: Math.max(od, prev.outsideDiameter),
        });
      if (next?.kind === 'bend') out.push({ kind: 'tangent', at: seg.end, dir: seg.dir, od });
      if (prev?.kind === 'bend') out.push({ kind: 'tangent', at: seg.start, dir: back, od });
      const endType = seg.element.endType ?? 'plain';
      const ends: [Vec3, Vec3, boolean][] = [
        [seg.start, back, prev === undefined],
        [seg.end, seg.dir, next === undefined],
      ];
      for (const [at, dir, free] of ends) {
        const nextToBend = (dir === back ? prev : next)?.kind === 'bend';
        if (nextToBend) continue;
        if (endType === 'threaded') {
          for (const k of [0.15, 0.35, 0.55])
            out.push({ kind: 'thread', at: add(at, scale(dir, -k * od)), dir, od });
        } else if (endType === 'grooved')
          out.push({ kind: 'groove', at: add(at, scale(dir, -0.4 * od)), dir, od });
        else if (free && endType === 'bevel') out.push({ kind: 'bevel', at, dir, od });
        else if (free) out.push({ kind: 'open', at, dir, od });
      }
    } else {
      if (prev === undefined)
        out.push({
          kind: 'open',
          at: seg.start,
          dir: scale(seg.dirIn, -1),
          od: seg.outsideDiameter,
        });
      if (next === undefined)
        out.push({ kind: 'open', at: seg.end, dir: seg.dirOut, od: seg.outsideDiameter });
    }
  });
  return out;
}

interface MarkerLook {
  readonly geometry: BufferGeometry;
  readonly color: string;
  /** Scale per OD (rings are unit-radius shapes). */
  readonly grow: number;
  /** Offset of the shape's centre along dir, in ODs. */
  readonly offset: number;
}

const LOOKS: Partial<Record<MarkerKind, () => MarkerLook>> = {
  weld: () => ({
    geometry: new TorusGeometry(1, 0.14, 3, 10).rotateX(Math.PI / 2),
    color: '#2b3440',
    grow: 0.52,
    offset: 0,
  }),
  open: () => ({
    geometry: new CircleGeometry(1, 10).rotateX(-Math.PI / 2),
    color: '#364151',
    grow: 0.5,
    offset: 0.001,
  }),
  bevel: () => ({
    geometry: new CylinderGeometry(0.72, 1.04, 0.6, 10, 1, true),
    color: '#74859a',
    grow: 0.5,
    offset: 0.15,
  }),
};

/** Ring marks drawn as line loops just outside the pipe (lines cost far less than triangles in software rendering). */
const LINE_RINGS: Partial<Record<MarkerKind, { color: string; grow: number }>> = {
  tangent: { color: '#e6eaef', grow: 0.56 },
  thread: { color: '#1d232c', grow: 0.56 },
  groove: { color: '#1d232c', grow: 0.6 },
};
const RING_POINTS = 12;

/** Line-segment circles around each marker's axis. */
export function ringLineGeometry(markers: readonly Marker[], grow: number): BufferGeometry {
  const pos = new Float32Array(markers.length * RING_POINTS * 2 * 3);
  let k = 0;
  for (const m of markers) {
    const ref: Vec3 = Math.abs(m.dir.y) < 0.9 ? { x: 0, y: 1, z: 0 } : { x: 1, y: 0, z: 0 };
    const u = normalize(sub(ref, scale(m.dir, dot(ref, m.dir))));
    const w = cross(m.dir, u);
    const r = m.od * grow;
    const at = (i: number) => {
      const a = (i / RING_POINTS) * Math.PI * 2;
      return add(m.at, add(scale(u, r * Math.cos(a)), scale(w, r * Math.sin(a))));
    };
    for (let i = 0; i < RING_POINTS; i++) {
      for (const p of [at(i), at(i + 1)]) {
        pos[k++] = p.x;
        pos[k++] = p.y;
        pos[k++] = p.z;
      }
    }
  }
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(pos, 3));
  g.computeBoundingSphere();
  return g;
}

const lineMaterials = new Map<string, LineBasicMaterial>();
function lineMaterial(color: string): LineBasicMaterial {
  let m = lineMaterials.get(color);
  if (!m) {
    m = new LineBasicMaterial({ color });
    lineMaterials.set(color, m);
  }
  return m;
}

function RingLines({
  markers,
  color,
  grow,
}: {
  readonly markers: readonly Marker[];
  readonly color: string;
  readonly grow: number;
}) {
  const geometry = useMemo(() => ringLineGeometry(markers, grow), [markers, grow]);
  useLayoutEffect(() => () => geometry.dispose(), [geometry]);
  return <lineSegments geometry={geometry} material={lineMaterial(color)} raycast={() => null} />;
}

const markerMaterials = new Map<string, Material>();
/** Marker materials are double-sided: flat rings and discs are seen from both sides. */
function markerMaterial(color: string): Material {
  let m = markerMaterials.get(color);
  if (!m) {
    m = new MeshLambertMaterial({ color, side: DoubleSide });
    markerMaterials.set(color, m);
  }
  return m;
}

const scratch = new Object3D();

function MarkerInstances({
  kind,
  markers,
}: {
  readonly kind: MarkerKind;
  readonly markers: readonly Marker[];
}) {
  const ref = useRef<InstancedMesh>(null);
  const look = useMemo(() => LOOKS[kind]!(), [kind]);
  useLayoutEffect(() => () => look.geometry.dispose(), [look]);
  useLayoutEffect(() => {
    const mesh = ref.current;
    if (!mesh) return;
    markers.forEach((m, i) => {
      const at = add(m.at, scale(m.dir, look.offset * m.od));
      scratch.position.set(at.x, at.y, at.z);
      scratch.quaternion.set(...quaternionAlong(m.dir));
      const s = m.od * look.grow;
      scratch.scale.set(s, s, s);
      scratch.updateMatrix();
      mesh.setMatrixAt(i, scratch.matrix);
    });
    mesh.instanceMatrix.needsUpdate = true;
    mesh.computeBoundingSphere();
  }, [markers, look]);
  return (
    <instancedMesh
      key={markers.length}
      ref={ref}
      args={[look.geometry, markerMaterial(look.color), markers.length]}
      raycast={() => null}
    />
  );
}

/** All end marks of the spool. */
export function EndMarkers({ segments }: { readonly segments: readonly PathSegment[] }) {
  const byKind = useMemo(() => {
    const groups = new Map<MarkerKind, Marker[]>();
    for (const m of computeMarkers(segments)) {
      const list = groups.get(m.kind) ?? [];
      list.push(m);
      groups.set(m.kind, list);
    }
    return groups;
  }, [segments]);
  return (
    <group>
      {[...byKind].map(([kind, markers]) => {
        const ring = LINE_RINGS[kind];
        return ring ? (
          <RingLines key={kind} markers={markers} color={ring.color} grow={ring.grow} />
        ) : (
          <MarkerInstances key={kind} kind={kind} markers={markers} />
        );
      })}
    </group>
  );
}
