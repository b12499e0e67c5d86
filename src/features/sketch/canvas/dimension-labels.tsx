import { useEffect, type MutableRefObject, type ReactNode } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import { Vector3 } from 'three';
import type { CheckStatus } from '@shared/engine/types';
import type { UnitSystem } from '@shared/model/spool';
import { UNIT_LABELS, convert } from '@shared/units/units';
import type { PathSegment } from '../geometry/spool-path';
import type { Vec3 } from '../geometry/vec';
import type { DimensionMode } from '../store/spool-store';
import { STATUS_STYLES } from './status-style';

/*
 * Labels are plain DOM nodes in one overlay above the canvas; a frame callback inside the
 * canvas moves them to their projected anchors on every rendered frame (no React work per
 * frame, no per-label React root), so they stay crisp and cheap.
 */

/** In `auto` mode straights are labelled while the spool has at most this many elements; beyond it only the selected and hovered ones. */
export const AUTO_LABEL_LIMIT = 24;
/** Most labels drawn in `all` mode. */
export const ALL_LABEL_LIMIT = 400;

const fmt = (v: number) => String(Math.round(v * 100) / 100);

/**
 * Label text of an element: a straight's cut length (and its leg length when bends take
 * tangent from it), a bend's angle and radius. Lengths are in the document's `units` and
 * shown in `display` units (default: the same).
 */
export function dimensionText(
  seg: PathSegment,
  units: UnitSystem,
  legLength?: number,
  display: UnitSystem = units,
): string {
  const u = UNIT_LABELS[display].length;
  const len = (v: number) => fmt(convert(v, 'length', units, display));
  if (seg.kind === 'bend') return `${fmt(seg.angleDeg)}° R${len(seg.radius)} ${u}`;
  const leg =
    legLength !== undefined && Math.abs(legLength - seg.length) > 1e-6
      ? ` · leg ${len(legLength)}`
      : '';
  return `${len(seg.length)} ${u}${leg}`;
}

/** Which segments get a label. */
export function pickLabelled(
  segments: readonly PathSegment[],
  mode: DimensionMode,
  selectedId: string | null,
  hoveredId: string | null,
): PathSegment[] {
  const focused = (s: PathSegment) => s.id === selectedId || s.id === hoveredId;
  if (mode === 'all') return segments.filter((s, i) => i < ALL_LABEL_LIMIT || focused(s));
  if (mode === 'auto' && segments.length <= AUTO_LABEL_LIMIT)
    return segments.filter((s) => s.kind === 'straight' || focused(s));
  return segments.filter(focused);
}

/** A label for the overlay: an anchor in document units and its content. */
export interface ScreenLabel {
  readonly key: string;
  readonly anchor: Vec3;
  readonly content: ReactNode;
  readonly className?: string;
}

/** Dimension labels of the chosen segments, with the status glyph as a non-colour cue. */
export function dimensionLabels(
  segments: readonly PathSegment[],
  statuses: ReadonlyMap<string, CheckStatus>,
  units: UnitSystem,
  mode: DimensionMode,
  selectedId: string | null,
  hoveredId: string | null,
  legs?: ReadonlyMap<string, number>,
  display: UnitSystem = units,
): ScreenLabel[] {
  return pickLabelled(segments, mode, selectedId, hoveredId).map((seg) => {
    const st = STATUS_STYLES[statuses.get(seg.id) ?? 'invalid'];
    const emphasis = seg.id === selectedId || seg.id === hoveredId;
    return {
      key: seg.id,
      anchor: seg.labelAnchor,
      className: `whitespace-nowrap rounded border bg-white px-1 leading-tight text-steel-800 ${emphasis ? 'border-steel-700 text-xs font-semibold' : 'border-steel-300 text-[10px]'}`,
      content: (
        <span data-label-for={seg.id}>
          <span style={{ color: st.ink }} aria-label={st.label}>
            {st.glyph}
          </span>{' '}
          <span className="text-steel-500">{seg.id}</span>{' '}
          {dimensionText(seg, units, legs?.get(seg.id), display)}
        </span>
      ),
    };
  });
}

export type LabelRegistry = MutableRefObject<Map<string, HTMLDivElement>>;

/** The DOM side: one absolutely placed node per label, parked off-screen until projected. */
export function LabelOverlay({
  labels,
  registry,
}: {
  readonly labels: readonly ScreenLabel[];
  readonly registry: LabelRegistry;
}) {
  return (
    <div
      className="pointer-events-none absolute inset-0 overflow-hidden font-sans"
      data-testid="sketch-labels"
    >
      {labels.map((l) => (
        <div
          key={l.key}
          ref={(el) => {
            if (el) registry.current.set(l.key, el);
            else registry.current.delete(l.key);
          }}
          className={`absolute top-0 left-0 ${l.className ?? ''}`}
          style={{ transform: 'translate(-10000px, 0)' }}
        >
          {l.content}
        </div>
      ))}
    </div>
  );
}

const v = new Vector3();

/** The canvas side: moves each label to its anchor's screen point after every rendered frame. */
export function LabelProjector({
  labels,
  registry,
  scale,
}: {
  readonly labels: readonly ScreenLabel[];
  readonly registry: LabelRegistry;
  readonly scale: number;
}) {
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => invalidate(), [labels, invalidate]);
  useFrame(({ camera, size }) => {
    for (const l of labels) {
      const el = registry.current.get(l.key);
      if (!el) continue;
      v.set(l.anchor.x * scale, l.anchor.y * scale, l.anchor.z * scale).project(camera);
      if (v.z < -1 || v.z > 1) {
        el.style.transform = 'translate(-10000px, 0)';
        continue;
      }
      const x = ((v.x + 1) / 2) * size.width;
      const y = ((1 - v.y) / 2) * size.height;
      el.style.transform = `translate(${x.toFixed(1)}px, ${y.toFixed(1)}px) translate(-50%, -50%)`;
    }
  });
  return null;
}
