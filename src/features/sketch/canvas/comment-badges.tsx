import { useContext, useEffect } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import { Vector3 } from 'three';
import type { PathSegment, SpoolPath } from '../geometry/spool-path';
import { BadgeContext } from './comment-badges-context';

export {
  CommentBadgeOverlay,
  CommentBadgesProvider,
  type CommentBadgeValue,
} from './comment-badges-context';

const v = new Vector3();

/** The point on the element's centreline halfway along it (a bend's arc middle, not its chord's). */
export function centreOf(seg: PathSegment): [number, number, number] {
  if (seg.kind === 'straight')
    return [
      (seg.start.x + seg.end.x) / 2,
      (seg.start.y + seg.end.y) / 2,
      (seg.start.z + seg.end.z) / 2,
    ];
  const phi = seg.angleRad / 2;
  const c = Math.cos(phi) * seg.radius;
  const s = Math.sin(phi) * seg.radius;
  return [
    seg.centre.x + c * seg.xAxis.x + s * seg.yAxis.x,
    seg.centre.y + c * seg.xAxis.y + s * seg.yAxis.y,
    seg.centre.z + c * seg.xAxis.z + s * seg.yAxis.z,
  ];
}

/** The canvas side, inside the `<Canvas>`: moves each badge beside its element's centre after every frame. */
export function CommentBadgeProjector({
  path,
  scale,
}: {
  readonly path: SpoolPath;
  readonly scale: number;
}) {
  const ctx = useContext(BadgeContext);
  const invalidate = useThree((s) => s.invalidate);
  const counts = ctx?.counts;
  useEffect(() => invalidate(), [counts, path, invalidate]);
  useFrame(({ camera, size }) => {
    ctx?.place((id) => {
      const seg = path.byId.get(id);
      if (!seg) return null;
      v.set(...centreOf(seg))
        .multiplyScalar(scale)
        .project(camera);
      if (v.z < -1 || v.z > 1) return null;
      return { x: ((v.x + 1) / 2) * size.width, y: ((1 - v.y) / 2) * size.height };
    });
  });
  return null;
}
