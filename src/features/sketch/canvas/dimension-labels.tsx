import { memo } from 'react';
import { Html } from '@react-three/drei';
import type { CheckStatus } from '@shared/engine/types';
import type { UnitSystem } from '@shared/model/spool';
import { UNIT_LABELS } from '@shared/units/units';
import type { PathSegment } from '../geometry/spool-path';
import type { DimensionMode } from '../store/spool-store';
import { STATUS_STYLES } from './status-style';

/** In `auto` mode every element is labelled up to this many elements; beyond it only the selected and hovered ones. */
export const AUTO_LABEL_LIMIT = 60;
/** Most labels drawn in `all` mode (each is a DOM node moved on every frame). */
export const ALL_LABEL_LIMIT = 400;

const fmt = (v: number) => String(Math.round(v * 100) / 100);

/** Label text of an element: cut length of a straight, angle and radius of a bend. */
export function dimensionText(seg: PathSegment, units: UnitSystem): string {
  const u = UNIT_LABELS[units].length;
  return seg.kind === 'straight' ? `${fmt(seg.length)} ${u}` : `${fmt(seg.angleDeg)}° R${fmt(seg.radius)} ${u}`;
}

/** Which segments get a label. */
export function pickLabelled(segments: readonly PathSegment[], mode: DimensionMode, selectedId: string | null, hoveredId: string | null): PathSegment[] {
  if (mode === 'none') return segments.filter((s) => s.id === selectedId || s.id === hoveredId);
  if (mode === 'all' || segments.length <= AUTO_LABEL_LIMIT) {
    const first = segments.slice(0, ALL_LABEL_LIMIT);
    const extra = segments.filter((s, i) => i >= ALL_LABEL_LIMIT && (s.id === selectedId || s.id === hoveredId));
    return [...first, ...extra];
  }
  return segments.filter((s) => s.id === selectedId || s.id === hoveredId);
}

interface LabelProps {
  readonly id: string;
  readonly text: string;
  readonly status: CheckStatus;
  readonly x: number;
  readonly y: number;
  readonly z: number;
  readonly emphasis: boolean;
}

const DimensionLabel = memo(function DimensionLabel({ id, text, status, x, y, z, emphasis }: LabelProps) {
  const st = STATUS_STYLES[status];
  return (
    <Html position={[x, y, z]} center zIndexRange={[30, 0]} style={{ pointerEvents: 'none' }}>
      <div
        data-label-for={id}
        className={`whitespace-nowrap rounded border bg-white/90 px-1 font-sans leading-tight text-steel-800 shadow-sm ${emphasis ? 'border-steel-700 text-xs font-semibold' : 'border-steel-300 text-[10px]'}`}
      >
        <span style={{ color: st.ink }} aria-label={st.label}>
          {st.glyph}
        </span>{' '}
        <span className="text-steel-500">{id}</span> {text}
      </div>
    </Html>
  );
});

export interface DimensionLabelsProps {
  readonly segments: readonly PathSegment[];
  readonly statuses: ReadonlyMap<string, CheckStatus>;
  readonly units: UnitSystem;
  readonly mode: DimensionMode;
  readonly selectedId: string | null;
  readonly hoveredId: string | null;
}

/** Dimension labels (drei Html, so text stays crisp and readable at any zoom). */
export function DimensionLabels({ segments, statuses, units, mode, selectedId, hoveredId }: DimensionLabelsProps) {
  const shown = pickLabelled(segments, mode, selectedId, hoveredId);
  return (
    <group>
      {shown.map((seg) => (
        <DimensionLabel
          key={seg.id}
          id={seg.id}
          text={dimensionText(seg, units)}
          status={statuses.get(seg.id) ?? 'invalid'}
          x={seg.labelAnchor.x}
          y={seg.labelAnchor.y}
          z={seg.labelAnchor.z}
          emphasis={seg.id === selectedId || seg.id === hoveredId}
        />
      ))}
    </group>
  );
}
