import { Component, Suspense, type ReactNode } from 'react';
import { SketchCanvasLazy } from '../canvas/sketch-canvas-lazy';

/** Keeps the rest of the sketcher usable when WebGL is not available. */
class CanvasBoundary extends Component<{ children: ReactNode }, { failed: string | null }> {
  override state = { failed: null as string | null };
  static getDerivedStateFromError(error: unknown) {
    return { failed: error instanceof Error ? error.message : String(error) };
  }
  override render() {
    if (this.state.failed) {
      return (
        <div
          role="alert"
          className="flex h-full items-center justify-center p-6 text-center text-sm text-steel-600"
        >
          The 3D sketch could not start here ({this.state.failed}). The element list and the
          inspector still work.
        </div>
      );
    }
    return this.props.children;
  }
}

/** Where the 3D sketch mounts (loaded on demand: three.js is a separate download). */
export function CanvasSlot() {
  return (
    <CanvasBoundary>
      <Suspense
        fallback={
          <div
            className="flex h-full items-center justify-center bg-steel-50 text-sm text-steel-500"
            role="status"
          >
            Loading the 3D sketch…
          </div>
        }
      >
        <SketchCanvasLazy />
      </Suspense>
    </CanvasBoundary>
  );
}
