import { useEffect, useMemo } from 'react';
import { Html } from '@react-three/drei';
import { GridHelper } from 'three';
import type { BoundingBox } from '../geometry/spool-path';
import { boxCentre, boxSize } from '../geometry/spool-path';
import { plainMaterial } from './materials';
import { niceStep } from './scene-math';

const AXIS_INK = '#364151';

function Arrow({ from, dir, length, thick, label, strong }: { from: [number, number, number]; dir: 'x' | 'y' | '-z'; length: number; thick: number; label: string; strong?: boolean }) {
  const rot: [number, number, number] = dir === 'x' ? [0, 0, -Math.PI / 2] : dir === '-z' ? [-Math.PI / 2, 0, 0] : [0, 0, 0];
  const unit: [number, number, number] = dir === 'x' ? [1, 0, 0] : dir === '-z' ? [0, 0, -1] : [0, 1, 0];
  const at = (k: number): [number, number, number] => [from[0] + unit[0] * k, from[1] + unit[1] * k, from[2] + unit[2] * k];
  return (
    <group>
      <mesh position={at(length / 2)} rotation={rot} material={plainMaterial(AXIS_INK)} raycast={() => null}>
        <cylinderGeometry args={[thick, thick, length, 6, 1, true]} />
      </mesh>
      <mesh position={at(length + thick * 3)} rotation={rot} material={plainMaterial(AXIS_INK)} raycast={() => null}>
        <coneGeometry args={[thick * (strong ? 4 : 3), thick * 6, 8]} />
      </mesh>
      <Html position={at(length + thick * 10)} center zIndexRange={[20, 0]} style={{ pointerEvents: 'none' }}>
        <div className={`whitespace-nowrap font-sans text-steel-700 ${strong ? 'rounded-full border border-steel-700 bg-white px-1.5 text-xs font-semibold' : 'text-[11px]'}`}>{label}</div>
      </Html>
    </group>
  );
}

/**
 * A ground grid under the spool (a round step, at least 12 lines each way) and an axis key at
 * its south-west corner: East and Up arrows and a bold North marker.
 */
export function GridAndAxes({ bbox }: { readonly bbox: BoundingBox }) {
  const size = boxSize(bbox);
  const centre = boxCentre(bbox);
  const span = Math.max(size.x, size.z, 1) * 1.4;
  const step = niceStep(span / 12);
  const cells = Math.max(4, Math.ceil(span / step));
  const extent = cells * step;
  const floor = bbox.min.y - Math.max(size.y, 1) * 0.02;
  const cx = Math.round(centre.x / step) * step;
  const cz = Math.round(centre.z / step) * step;
  const grid = useMemo(() => new GridHelper(extent, cells, '#a3b0bf', '#cbd3dc'), [extent, cells]);
  useEffect(() => () => grid.dispose(), [grid]);
  const arrowLength = Math.max(step * 1.5, extent * 0.08);
  const thick = arrowLength * 0.025;
  const corner: [number, number, number] = [cx - extent / 2, floor, cz + extent / 2];
  return (
    <group>
      <primitive object={grid} position={[cx, floor, cz]} raycast={() => null} />
      <Arrow from={corner} dir="x" length={arrowLength} thick={thick} label="East" />
      <Arrow from={corner} dir="y" length={arrowLength} thick={thick} label="Up" />
      <Arrow from={corner} dir="-z" length={arrowLength} thick={thick} label="N" strong />
    </group>
  );
}
