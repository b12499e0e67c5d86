import { useEffect, useMemo } from 'react';
import { GridHelper } from 'three';
import type { BoundingBox } from '../geometry/spool-path';
import { boxCentre, boxSize } from '../geometry/spool-path';
import type { ScreenLabel } from './dimension-labels';
import { plainMaterial } from './materials';
import { niceStep } from './scene-math';

const AXIS_INK = '#364151';

function Arrow({
  from,
  dir,
  length,
  thick,
  strong,
}: {
  from: [number, number, number];
  dir: 'x' | 'y' | '-z';
  length: number;
  thick: number;
  strong?: boolean;
}) {
  const rot: [number, number, number] =
    dir === 'x' ? [0, 0, -Math.PI / 2] : dir === '-z' ? [-Math.PI / 2, 0, 0] : [0, 0, 0];
  const unit: [number, number, number] =
    dir === 'x' ? [1, 0, 0] : dir === '-z' ? [0, 0, -1] : [0, 1, 0];
  const at = (k: number): [number, number, number] => [
    from[0] + unit[0] * k,
    from[1] + unit[1] * k,
    from[2] + unit[2] * k,
  ];
  return (
    <group>
      <mesh
        position={at(length / 2)}
        rotation={rot}
        material={plainMaterial(AXIS_INK)}
        raycast={() => null}
      >
        <cylinderGeometry args={[thick, thick, length, 6, 1, true]} />
      </mesh>
      <mesh
        position={at(length + thick * 3)}
        rotation={rot}
        material={plainMaterial(AXIS_INK)}
        raycast={() => null}
      >
        <coneGeometry args={[thick * (strong ? 4 : 3), thick * 6, 8]} />
      </mesh>
    </group>
  );
}

/**
 * A ground grid under the spool (a round step, about 12 cells each way) and an axis key by
 * the spool's south-west corner: East and Up arrows and a bold North marker.
 */
interface GridLayout {
  readonly step: number;
  readonly cells: number;
  readonly extent: number;
  readonly floor: number;
  readonly cx: number;
  readonly cz: number;
  readonly corner: [number, number, number];
  readonly arrowLength: number;
  readonly thick: number;
}

function layoutGrid(bbox: BoundingBox): GridLayout {
  const size = boxSize(bbox);
  const centre = boxCentre(bbox);
  // A tall riser still gets a grid wide enough to read as the ground.
  const span = Math.max(size.x, size.z, size.y * 0.6, 1) * 1.4;
  const step = niceStep(span / 12);
  const cells = Math.max(4, Math.ceil(span / step));
  const extent = cells * step;
  const floor = bbox.min.y - Math.max(size.y, 1) * 0.02;
  // The key sits just outside the spool's south-west corner, where fitting keeps it in view.
  const corner: [number, number, number] = [bbox.min.x - step, floor, bbox.max.z + step];
  const arrowLength = Math.max(step * 1.5, extent * 0.08);
  return {
    step,
    cells,
    extent,
    floor,
    cx: Math.round(centre.x / step) * step,
    cz: Math.round(centre.z / step) * step,
    corner,
    arrowLength,
    thick: arrowLength * 0.025,
  };
}

/** Overlay labels of the axis key (document units). */
export function axisLabels(bbox: BoundingBox): ScreenLabel[] {
  const { corner: c, arrowLength: l, thick: t } = layoutGrid(bbox);
  const d = l + t * 12;
  return [
    {
      key: 'axis-east',
      anchor: { x: c[0] + d, y: c[1], z: c[2] },
      content: 'East',
      className: 'text-[11px] text-steel-700',
    },
    {
      key: 'axis-up',
      anchor: { x: c[0], y: c[1] + d, z: c[2] },
      content: 'Up',
      className: 'text-[11px] text-steel-700',
    },
    {
      key: 'axis-north',
      anchor: { x: c[0], y: c[1], z: c[2] - d },
      content: 'N',
      className:
        'rounded-full border border-steel-700 bg-white px-1.5 text-xs font-semibold text-steel-800',
    },
  ];
}

/**
 * A ground grid under the spool (a round step, about 12 cells each way) and an axis key by
 * the spool's south-west corner: East and Up arrows and a bold North marker (labels via
 * `axisLabels`).
 */
export function GridAndAxes({ bbox }: { readonly bbox: BoundingBox }) {
  const { extent, cells, cx, cz, floor, corner, arrowLength, thick } = layoutGrid(bbox);
  const grid = useMemo(() => new GridHelper(extent, cells, '#a3b0bf', '#cbd3dc'), [extent, cells]);
  useEffect(() => () => grid.dispose(), [grid]);
  return (
    <group>
      <primitive object={grid} position={[cx, floor, cz]} raycast={() => null} />
      <Arrow from={corner} dir="x" length={arrowLength} thick={thick} />
      <Arrow from={corner} dir="y" length={arrowLength} thick={thick} />
      <Arrow from={corner} dir="-z" length={arrowLength} thick={thick} strong />
    </group>
  );
}
