import { useCallback, useEffect, useLayoutEffect, useRef } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import { Raycaster, Vector2, Vector3, type Object3D, type OrthographicCamera } from 'three';
import { add, scale as scaleVec, sub, type Vec3 } from '../geometry/vec';
import { elementAtTriangle, type Range } from './element-chunks';
import { segmentBox, type SpoolPath } from '../geometry/spool-path';
import { fitOrthographic } from './scene-math';
import type { SpoolStore } from '../store/spool-store';

/** Direction from the target to the camera: a true isometric view from south-east, above. */
export const ISOMETRIC_VIEW = new Vector3(1, 1, 1).normalize();

interface OrbitLike {
  target: Vector3;
  update(): void;
  addEventListener?(type: 'start', listener: () => void): void;
  removeEventListener?(type: 'start', listener: () => void): void;
}

/**
 * Test and benchmark hooks, installed as `window.__spoolwright` by every mounted canvas.
 * Coordinates are CSS pixels in the page (what `page.mouse.click` takes).
 */
export interface SpoolwrightCanvasHooks {
  /**
   * Screen point on an element where a click reaches it: the first of several centreline
   * points (mid-point first) not hidden by another element; the mid-point when all are hidden;
   * null when the element is not in the spool.
   */
  project(elementId: string): { x: number; y: number } | null;
  /** Frames rendered since the canvas mounted. */
  readonly frames: number;
  /** Rotate the view about the vertical through the orbit target (radians) and render, as a drag would (moving resolution included). */
  orbitBy(radians: number): void;
  /** Frame the whole spool. */
  fit(): void;
  /** Zoom to one element, keeping the view direction (as "Focus on selected"). */
  focus(elementId: string): boolean;
  /** Size of the canvas and the screen box (page px) of the whole spool's bounding box corners. */
  spoolScreenBox(): {
    canvas: { left: number; top: number; width: number; height: number };
    min: { x: number; y: number };
    max: { x: number; y: number };
  };
  /** Request a render. */
  invalidate(): void;
  /** RGBA of the drawing buffer at a page point (the canvas keeps its buffer). */
  readPixel(x: number, y: number): [number, number, number, number] | null;
  /** The editor store behind the canvas. */
  readonly store: SpoolStore;
  /** The three.js renderer (benchmarks wrap its `render` to time it). */
  readonly renderer: { render(...args: never[]): void };
  /** WebGL renderer string and draw statistics of the last frame. */
  info(): { renderer: string; calls: number; triangles: number };
}

declare global {
  interface Window {
    __spoolwright?: SpoolwrightCanvasHooks;
  }
}

export interface ViewControllerProps {
  readonly path: SpoolPath;
  /** Scene units per document unit. */
  readonly scale: number;
  readonly fitRequest: number;
  /** Element to zoom to, with a counter that changes on each request. */
  readonly focus?: { readonly id: string; readonly request: number } | null;
  readonly store: SpoolStore;
}

/** Frames the spool (on mount, on `requestFit()`, when the first element appears) and installs the hooks. */
export function ViewController({ path, scale, fitRequest, focus, store }: ViewControllerProps) {
  const camera = useThree((s) => s.camera) as OrthographicCamera;
  const controls = useThree((s) => s.controls) as unknown as OrbitLike | null;
  const size = useThree((s) => s.size);
  const gl = useThree((s) => s.gl);
  const invalidate = useThree((s) => s.invalidate);
  const scene = useThree((s) => s.scene);
  const perf = useThree((s) => s.performance);
  const frames = useRef(0);
  const pathRef = useRef(path);
  pathRef.current = path;
  // Read at fit time: a resize keeps the user's view (the camera frustum follows the size).
  const sizeRef = useRef(size);
  sizeRef.current = size;
  const hasSize = size.width > 0 && size.height > 0;

  useFrame(() => {
    frames.current++;
  });

  // True while the view is as the last fit left it: then a resize fits again, so the first
  // fit made before the layout settled never leaves a tall spool clipped.
  const fitted = useRef(false);

  /** Look at a box (document units) from `viewDir`, zoomed so it fills the view with a margin. */
  const frame = useCallback(
    (bmin: Vec3, bmax: Vec3, viewDir: Vector3) => {
      const min = new Vector3(bmin.x, bmin.y, bmin.z).multiplyScalar(scale);
      const max = new Vector3(bmax.x, bmax.y, bmax.z).multiplyScalar(scale);
      const { width, height } = sizeRef.current;
      const f = fitOrthographic(min, max, viewDir, width, height, camera.up);
      const diag = Math.max(min.distanceTo(max), 1);
      const dist = diag * 2 + 10;
      camera.position.copy(f.target).addScaledVector(viewDir, dist);
      camera.near = 0.1;
      camera.far = dist + diag * 4;
      camera.lookAt(f.target);
      camera.zoom = f.zoom;
      camera.updateProjectionMatrix();
      camera.updateMatrixWorld();
      if (controls) {
        controls.target.copy(f.target);
        controls.update();
      }
      invalidate();
    },
    [camera, controls, scale, invalidate],
  );

  const fit = useCallback(() => {
    const { bbox } = pathRef.current;
    frame(bbox.min, bbox.max, ISOMETRIC_VIEW);
    fitted.current = true;
  }, [frame]);

  const focusOn = useCallback(
    (id: string) => {
      const seg = pathRef.current.byId.get(id);
      if (!seg) return false;
      const box = segmentBox(seg);
      const target = controls?.target ?? new Vector3();
      const dir = camera.position.clone().sub(target);
      const viewDir = dir.lengthSq() > 0 ? dir.normalize() : ISOMETRIC_VIEW.clone();
      frame(box.min, box.max, viewDir);
      fitted.current = false;
      return true;
    },
    [camera, controls, frame],
  );

  // The user moving the view ends the "as fitted" state.
  useEffect(() => {
    if (!controls?.addEventListener) return;
    const onStart = () => {
      fitted.current = false;
    };
    controls.addEventListener('start', onStart);
    return () => controls.removeEventListener?.('start', onStart);
  }, [controls]);

  // A resize keeps the user's view, but refits a view nobody has moved since it was fitted.
  useLayoutEffect(() => {
    if (fitted.current && hasSize) fit();
  }, [size.width, size.height, hasSize, fit]);

  const focusRequest = focus?.request;
  const focusId = focus?.id;
  useLayoutEffect(() => {
    if (focusRequest !== undefined && focusId && hasSize) focusOn(focusId);
    // Only a new request focuses; a later edit of the document does not.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [focusRequest]);

  // Fit once the canvas has a size and the controls exist, and on each request.
  useLayoutEffect(() => {
    if (hasSize) fit();
  }, [fit, fitRequest, hasSize]);

  // Fit when the first element appears (a new spool starts empty).
  const count = path.segments.length;
  const hadElements = useRef(count > 0);
  useEffect(() => {
    if (count > 0 && !hadElements.current) fit();
    hadElements.current = count > 0;
  }, [count, fit]);

  useEffect(() => {
    const hooks: SpoolwrightCanvasHooks = {
      project(id) {
        const seg = pathRef.current.byId.get(id);
        if (!seg) return null;
        const rect = gl.domElement.getBoundingClientRect();
        const along = (t: number): Vec3 => {
          if (seg.kind === 'straight') return add(seg.start, scaleVec(sub(seg.end, seg.start), t));
          const phi = seg.angleRad * t;
          return add(
            seg.centre,
            add(
              scaleVec(seg.xAxis, seg.radius * Math.cos(phi)),
              scaleVec(seg.yAxis, seg.radius * Math.sin(phi)),
            ),
          );
        };
        const toScreen = (q: Vec3) => {
          const p = new Vector3(q.x, q.y, q.z).multiplyScalar(scale).project(camera);
          return {
            ndc: new Vector2(p.x, p.y),
            x: rect.left + ((p.x + 1) / 2) * rect.width,
            y: rect.top + ((1 - p.y) / 2) * rect.height,
          };
        };
        const pickable: Object3D[] = [];
        scene.traverse((o) => {
          if (o.userData.elementRanges) pickable.push(o);
        });
        const ray = new Raycaster();
        for (const t of [0.5, 0.35, 0.65, 0.2, 0.8, 0.1, 0.9]) {
          const s = toScreen(along(t));
          ray.setFromCamera(s.ndc, camera);
          const hit = ray.intersectObjects(pickable, false)[0];
          const ranges = hit?.object.userData.elementRanges as Range[] | undefined;
          if (
            hit &&
            ranges &&
            hit.faceIndex != null &&
            elementAtTriangle(ranges, hit.faceIndex) === id
          )
            return { x: s.x, y: s.y };
        }
        const mid = toScreen(along(0.5));
        return { x: mid.x, y: mid.y };
      },
      get frames() {
        return frames.current;
      },
      orbitBy(radians) {
        const target = controls?.target ?? new Vector3();
        const offset = camera.position.clone().sub(target);
        offset.applyAxisAngle(new Vector3(0, 1, 0), radians);
        camera.position.copy(target).add(offset);
        camera.lookAt(target);
        controls?.update();
        fitted.current = false;
        // As a drag on the controls does: draw at the moving resolution until the view rests.
        perf.regress();
        invalidate();
      },
      fit,
      focus: focusOn,
      spoolScreenBox() {
        const rect = gl.domElement.getBoundingClientRect();
        const { bbox } = pathRef.current;
        let minX = Infinity;
        let minY = Infinity;
        let maxX = -Infinity;
        let maxY = -Infinity;
        for (const x of [bbox.min.x, bbox.max.x])
          for (const y of [bbox.min.y, bbox.max.y])
            for (const z of [bbox.min.z, bbox.max.z]) {
              const p = new Vector3(x, y, z).multiplyScalar(scale).project(camera);
              const sx = rect.left + ((p.x + 1) / 2) * rect.width;
              const sy = rect.top + ((1 - p.y) / 2) * rect.height;
              minX = Math.min(minX, sx);
              minY = Math.min(minY, sy);
              maxX = Math.max(maxX, sx);
              maxY = Math.max(maxY, sy);
            }
        return {
          canvas: { left: rect.left, top: rect.top, width: rect.width, height: rect.height },
          min: { x: minX, y: minY },
          max: { x: maxX, y: maxY },
        };
      },
      invalidate: () => invalidate(),
      readPixel(x, y) {
        const ctx = gl.getContext();
        const rect = gl.domElement.getBoundingClientRect();
        const px = Math.round(((x - rect.left) / rect.width) * ctx.drawingBufferWidth);
        const py = Math.round(((y - rect.top) / rect.height) * ctx.drawingBufferHeight);
        if (px < 0 || py < 0 || px >= ctx.drawingBufferWidth || py >= ctx.drawingBufferHeight)
          return null;
        const out = new Uint8Array(4);
        ctx.readPixels(
          px,
          ctx.drawingBufferHeight - 1 - py,
          1,
          1,
          ctx.RGBA,
          ctx.UNSIGNED_BYTE,
          out,
        );
        return [out[0]!, out[1]!, out[2]!, out[3]!];
      },
      store,
      renderer: gl as unknown as SpoolwrightCanvasHooks['renderer'],
      info() {
        const ctx = gl.getContext();
        const ext = ctx.getExtension('WEBGL_debug_renderer_info');
        const renderer = ext
          ? String(ctx.getParameter(ext.UNMASKED_RENDERER_WEBGL))
          : String(ctx.getParameter(ctx.RENDERER));
        return { renderer, calls: gl.info.render.calls, triangles: gl.info.render.triangles };
      },
    };
    window.__spoolwright = hooks;
    return () => {
      if (window.__spoolwright === hooks) delete window.__spoolwright;
    };
  }, [camera, controls, gl, invalidate, fit, focusOn, scale, store, scene, perf]);

  return null;
}
