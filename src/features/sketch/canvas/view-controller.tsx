import { useCallback, useEffect, useLayoutEffect, useRef } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import { Raycaster, Vector2, Vector3, type Object3D, type OrthographicCamera } from 'three';
import { add, scale as scaleVec, sub, type Vec3 } from '../geometry/vec';
import { elementAtTriangle, type Range } from './element-chunks';
import type { SpoolPath } from '../geometry/spool-path';
import type { SpoolStore } from '../store/spool-store';

/** Direction from the target to the camera: a true isometric view from south-east, above. */
export const ISOMETRIC_VIEW = new Vector3(1, 1, 1).normalize();

interface OrbitLike {
  target: Vector3;
  update(): void;
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
  readonly store: SpoolStore;
}

/** Frames the spool (on mount, on `requestFit()`, when the first element appears) and installs the hooks. */
export function ViewController({ path, scale, fitRequest, store }: ViewControllerProps) {
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

  const fit = useCallback(() => {
    const { bbox } = pathRef.current;
    const min = new Vector3(bbox.min.x, bbox.min.y, bbox.min.z).multiplyScalar(scale);
    const max = new Vector3(bbox.max.x, bbox.max.y, bbox.max.z).multiplyScalar(scale);
    const target = min.clone().add(max).multiplyScalar(0.5);
    const diag = Math.max(min.distanceTo(max), 1);
    const dist = diag * 2 + 10;
    camera.position.copy(target).addScaledVector(ISOMETRIC_VIEW, dist);
    camera.near = 0.1;
    camera.far = dist + diag * 4;
    camera.lookAt(target);
    camera.updateMatrixWorld();
    let w = 0;
    let h = 0;
    const inv = camera.matrixWorldInverse;
    for (const x of [min.x, max.x])
      for (const y of [min.y, max.y])
        for (const z of [min.z, max.z]) {
          const p = new Vector3(x, y, z).applyMatrix4(inv);
          const c = target.clone().applyMatrix4(inv);
          w = Math.max(w, Math.abs(p.x - c.x) * 2);
          h = Math.max(h, Math.abs(p.y - c.y) * 2);
        }
    const { width, height } = sizeRef.current;
    camera.zoom = Math.max(
      1e-4,
      0.85 * Math.min(width / Math.max(w, 1e-6), height / Math.max(h, 1e-6)),
    );
    camera.updateProjectionMatrix();
    if (controls) {
      controls.target.copy(target);
      controls.update();
    }
    invalidate();
  }, [camera, controls, scale, invalidate]);

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
        // As a drag on the controls does: draw at the moving resolution until the view rests.
        perf.regress();
        invalidate();
      },
      fit,
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
  }, [camera, controls, gl, invalidate, fit, scale, store, scene, perf]);

  return null;
}
