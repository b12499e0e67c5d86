import { memo, useEffect, useMemo } from 'react';
import type { ThreeEvent } from '@react-three/fiber';
import type { CheckStatus } from '@shared/engine/types';
import { plainMaterial, statusMaterial, type Highlight } from './materials';
import { createBendGeometry, createStraightGeometry } from './pipe-geometry';
import { sameSpec, type MeshSpec } from './scene-math';
import { SELECTION_COLOR } from './status-style';

export interface ElementMeshProps {
  readonly id: string;
  readonly spec: MeshSpec;
  readonly status: CheckStatus;
  readonly highlight: Highlight;
  readonly onSelect: (id: string) => void;
  readonly onHover: (id: string | null) => void;
}

function useSpecGeometry(spec: MeshSpec, grow = 1) {
  const { kind, od, size, arc } = spec;
  const geometry = useMemo(
    () => (kind === 'straight' ? createStraightGeometry(od * grow, size) : createBendGeometry(od * grow, size, arc)),
    [kind, od, size, arc, grow],
  );
  useEffect(() => () => geometry.dispose(), [geometry]);
  return geometry;
}

function ElementMeshImpl({ id, spec, status, highlight, onSelect, onHover }: ElementMeshProps) {
  const geometry = useSpecGeometry(spec);
  return (
    <mesh
      name={id}
      userData={{ elementId: id }}
      geometry={geometry}
      material={statusMaterial(status, highlight)}
      position={spec.position as [number, number, number]}
      quaternion={spec.quaternion as [number, number, number, number]}
      onClick={(e: ThreeEvent<MouseEvent>) => {
        e.stopPropagation();
        onSelect(id);
      }}
      onPointerOver={(e: ThreeEvent<PointerEvent>) => {
        e.stopPropagation();
        onHover(id);
      }}
      onPointerOut={() => onHover(null)}
    />
  );
}

/** One straight (open tube) or bend (torus segment), coloured and patterned by its status. */
export const ElementMesh = memo(
  ElementMeshImpl,
  (a, b) => a.id === b.id && a.status === b.status && a.highlight === b.highlight && a.onSelect === b.onSelect && a.onHover === b.onHover && sameSpec(a.spec, b.spec),
);

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
