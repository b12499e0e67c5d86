import { useCallback, useEffect, useMemo, useRef } from 'react';
import { Canvas } from '@react-three/fiber';
import { AdaptiveDpr, OrbitControls } from '@react-three/drei';
import type { CheckStatus, SpoolCheck } from '@shared/engine/types';
import { buildSpoolPath, legLengths } from '../geometry/spool-path';
import { useSpoolCheck, useSpoolStore, useSpoolStoreApi } from '../store/spool-store-context';
import { useDisplayUnits } from '../components/display-units';
import { LabelOverlay, LabelProjector, dimensionLabels } from './dimension-labels';
import { CHUNK_SIZE, ElementChunk, itemKey, type ChunkItem } from './element-chunks';
import { HighlightMesh, SelectionOutline } from './element-mesh';
import { CommentBadgeOverlay, CommentBadgeProjector } from './comment-badges';
import { EndMarkers } from './end-markers';
import { GridAndAxes, axisLabels } from './grid-and-axes';
import { meshSpecOf, sceneScale } from './scene-math';
import { StatusLegend } from './status-legend';
import { BACKGROUND_COLOR } from './status-style';
import { ISOMETRIC_VIEW, ViewController } from './view-controller';

/**
 * Pixel ratio while the view moves (orbit, pan, zoom): software WebGL is fill-bound, so the
 * canvas draws at half resolution during a move and sharp again 250 ms after it stops.
 */
export const MOVING_RESOLUTION = 0.5;

export interface SketchCanvasProps {
  readonly className?: string;
  /** The check to colour by; default: `useSpoolCheck()` of the store. */
  readonly check?: SpoolCheck;
  /** Show the status key in a strip above the drawing (default true). */
  readonly showLegend?: boolean;
}

/**
 * The 3D-lite isometric sketch of the spool in the nearest `SpoolStoreProvider`.
 *
 * - Orthographic camera from the south-east above; drag to orbit, right-drag / shift-drag
 *   to pan, wheel to zoom. "Fit to spool": `store.getState().requestFit()`.
 * - Straights are open tubes and bends torus segments at their true OD and bend radius,
 *   coloured and patterned by check status (see `STATUS_STYLES`, `StatusLegend`).
 * - Hover highlights; click selects (`store.select`); a click on empty space clears it.
 * - Labels follow `view.showDimensions`; antialiasing follows `view.antialias`.
 * - Renders on demand only (`frameloop="demand"`), device pixel ratio 1 (0.5 while the view
 *   moves, see `MOVING_RESOLUTION`).
 * - `window.__spoolwright` carries test hooks (`SpoolwrightCanvasHooks`), e.g. `project(id)`.
 * - No canvas-level keyboard shortcuts: keys belong to the page's drawing bar.
 *
 * Lazy-load it through `SketchCanvasLazy` (sketch-canvas-lazy.ts) to keep three.js out of
 * the first download.
 */
export function SketchCanvas({
  className,
  check: checkProp,
  showLegend = true,
}: SketchCanvasProps) {
  const store = useSpoolStoreApi();
  const derived = useSpoolCheck();
  const check = checkProp ?? derived;
  const doc = useSpoolStore((s) => s.doc);
  const selectedId = useSpoolStore((s) => s.selectedId);
  const hoveredId = useSpoolStore((s) => s.hoveredId);
  const view = useSpoolStore((s) => s.view);
  const select = useSpoolStore((s) => s.select);
  const hover = useSpoolStore((s) => s.hover);

  const path = useMemo(() => buildSpoolPath(doc), [doc]);
  // Labels read in the display units; without a units provider (benchmarks) in the document's.
  const displayUnits = useDisplayUnits();
  const display = displayUnits.doc === doc.units ? displayUnits.display : doc.units;
  const specs = useMemo(() => path.segments.map(meshSpecOf), [path]);
  const statuses = useMemo(
    () => new Map<string, CheckStatus>(check.elements.map((e) => [e.id, e.status])),
    [check],
  );
  const scale = sceneScale(doc.units);
  const chunks = useMemo(() => {
    const out: { items: ChunkItem[]; key: string }[] = [];
    for (let i = 0; i < path.segments.length; i += CHUNK_SIZE) {
      const items = path.segments.slice(i, i + CHUNK_SIZE).map((seg, k) => ({
        id: seg.id,
        spec: specs[i + k]!,
        status: statuses.get(seg.id) ?? 'invalid',
      }));
      out.push({ items, key: items.map(itemKey).join(';') });
    }
    return out;
  }, [path, specs, statuses]);
  const specOf = (id: string | null) =>
    id !== null ? specs[path.byId.get(id)?.index ?? -1] : undefined;
  const selectedSpec = specOf(selectedId);
  const hoveredSpec = hoveredId !== selectedId ? specOf(hoveredId) : undefined;
  useEffect(
    () => () => {
      document.body.style.cursor = '';
    },
    [],
  );
  const registry = useRef(new Map<string, HTMLDivElement>());
  const axes = useMemo(() => axisLabels(path.bbox), [path.bbox]);
  const labels = useMemo(
    () => [
      ...axes,
      ...dimensionLabels(
        path.segments,
        statuses,
        doc.units,
        view.showDimensions,
        selectedId,
        hoveredId,
        legLengths(path),
        display,
      ),
    ],
    [axes, path, statuses, doc.units, view.showDimensions, selectedId, hoveredId, display],
  );
  const onHover = useCallback(
    (id: string | null) => {
      hover(id);
      document.body.style.cursor = id ? 'pointer' : '';
    },
    [hover],
  );

  return (
    <div data-testid="sketch-canvas" className={`flex h-full w-full flex-col ${className ?? ''}`}>
      {/* The key sits in a strip above the drawing, not over it: in software rendering every
          DOM layer over the WebGL canvas is composited again on each frame. */}
      {showLegend ? (
        <StatusLegend
          summary={check.summary}
          className="shrink-0 border-b border-steel-200 bg-white px-2 py-1"
        />
      ) : null}
      <div className="relative min-h-0 flex-1">
        <Canvas
          key={view.antialias ? 'aa' : 'no-aa'}
          orthographic
          camera={{
            position: [ISOMETRIC_VIEW.x * 500, ISOMETRIC_VIEW.y * 500, ISOMETRIC_VIEW.z * 500],
            zoom: 2,
            near: 0.1,
            far: 1e7,
          }}
          frameloop="demand"
          flat
          dpr={1}
          performance={{ min: MOVING_RESOLUTION, debounce: 250 }}
          gl={{ antialias: view.antialias, preserveDrawingBuffer: true }}
          onPointerMissed={() => select(null)}
          role="img"
          aria-label="Isometric sketch of the spool"
        >
          <color attach="background" args={[BACKGROUND_COLOR]} />
          <ambientLight intensity={1.6} />
          <directionalLight position={[0.4, 1, 0.7]} intensity={1.2} />
          <group scale={scale}>
            {chunks.map((c, k) => (
              <ElementChunk
                key={k}
                items={c.items}
                chunkKey={c.key}
                onSelect={select}
                onHover={onHover}
              />
            ))}
            {hoveredSpec ? (
              <HighlightMesh
                spec={hoveredSpec}
                status={statuses.get(hoveredId!) ?? 'invalid'}
                highlight="hover"
              />
            ) : null}
            {selectedSpec ? (
              <HighlightMesh
                spec={selectedSpec}
                status={statuses.get(selectedId!) ?? 'invalid'}
                highlight="selected"
              />
            ) : null}
            {selectedSpec ? <SelectionOutline spec={selectedSpec} /> : null}
            <EndMarkers segments={path.segments} />
            <GridAndAxes bbox={path.bbox} />
          </group>
          <LabelProjector labels={labels} registry={registry} scale={scale} />
          <CommentBadgeProjector path={path} scale={scale} />
          <AdaptiveDpr pixelated />
          <OrbitControls makeDefault enableDamping={false} regress />
          <ViewController
            path={path}
            scale={scale}
            fitRequest={view.fitRequest}
            focus={view.focus}
            store={store}
          />
        </Canvas>
        <LabelOverlay labels={labels} registry={registry} />
        <CommentBadgeOverlay />
      </div>
    </div>
  );
}
