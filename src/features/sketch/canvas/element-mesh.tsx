import { useEffect, useMemo } from 'react';
import type { CheckStatus } from '@shared/engine/types';
import { plainMaterial, statusMaterial, type Highlight } from './materials';
import { createBendGeometry, createStraightGeometry } from './pipe-geometry';
import type { MeshSpec } from './scene-math';
import { worldGeometry } from './element-chunks';
import { SELECTION_COLOR } from './status-style';

export interface HighlightMeshProps {
  readonly spec: MeshSpec;
  readonly status: CheckStatus;
  readonly highlight: Highlight;
}

function useSpecGeometry(spec: MeshSpec, grow = 1) {
  const { kind, od, size, arc } = spec;
  const geometry = useMemo(
    () =>
      kind === 'straight'
        ? createStraightGeometry(od * grow, size)
        : createBendGeometry(od * grow, size, arc),
    [kind, od, size, arc, grow],
  );
  useEffect(() => () => geometry.dispose(), [geometry]);
  return geometry;
}

/**
 * The hovered or selected element drawn again, a little fatter, in its highlight material
 * over the merged chunk (it takes no pointer events: the chunk below does the picking).
 */
export function HighlightMesh({ spec, status, highlight }: HighlightMeshProps) {
  const geometry = useMemo(() => worldGeometry(spec, 1.06), [spec]);
  useEffect(() => () => geometry.dispose(), [geometry]);
  return (
    <mesh geometry={geometry} material={statusMaterial(status, highlight)} raycast={() => null} />
  );
}

/** A dark shell behind the selected element (drawn from the inside, so it reads as an outline). */
export function SelectionOutline({ spec }: { readonly spec: MeshSpec }) {
  const geometry = useSpecGeometry(spec, 1.35);
  return (
    <mesh
      geometry={geometry}
      material={plainMaterial(SELECTION_COLOR, { backSide: true })}
      position={spec.position as [number, number, number]}
      quaternion={spec.quaternion as [number, number, number, number]}
      raycast={() => null}
    />
  );
}
