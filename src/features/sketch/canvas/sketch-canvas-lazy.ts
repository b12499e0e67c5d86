import { lazy } from 'react';

/**
 * `SketchCanvas` as a lazily loaded component (three.js, R3F and drei load with it).
 * Render inside `<Suspense>` and a `SpoolStoreProvider`.
 */
export const SketchCanvasLazy = lazy(() =>
  import('./sketch-canvas').then((m) => ({ default: m.SketchCanvas })),
);
