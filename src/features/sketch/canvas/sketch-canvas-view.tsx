import { Component, Suspense, type ErrorInfo, type ReactNode } from 'react';
import type { SketchCanvasProps } from './sketch-canvas';
import { SketchCanvasLazy } from './sketch-canvas-lazy';

interface BoundaryState {
  readonly error: Error | null;
}

/** Keeps the page usable when the 3D view cannot start (no WebGL, lost context, load failure). */
class CanvasErrorBoundary extends Component<{ readonly children: ReactNode }, BoundaryState> {
  override state: BoundaryState = { error: null };

  static getDerivedStateFromError(error: Error): BoundaryState {
    return { error };
  }

  override componentDidCatch(error: Error, info: ErrorInfo) {
    // Logged as a warning: the rest of the sketcher keeps working without the 3D view.
    console.warn('sketch canvas failed:', error.message, info.componentStack ?? '');
  }

  override render() {
    if (this.state.error) {
      return (
        <div
          role="alert"
          data-testid="sketch-canvas-error"
          className="flex h-full items-center justify-center bg-steel-100 p-4 text-center text-sm text-steel-600"
        >
          The 3D sketch could not start in this browser ({this.state.error.message}). The element
          list and inspector still work.
        </div>
      );
    }
    return this.props.children;
  }
}

/**
 * The sketch canvas ready to drop into a page: lazily loaded (three.js stays out of the first
 * download), with a loading line and an error fallback. Must sit inside a `SpoolStoreProvider`.
 */
export function SketchCanvasView(props: SketchCanvasProps) {
  return (
    <CanvasErrorBoundary>
      <Suspense
        fallback={
          <div
            data-testid="sketch-canvas-loading"
            className="flex h-full items-center justify-center bg-steel-50 text-sm text-steel-500"
          >
            Loading the 3D sketch…
          </div>
        }
      >
        <SketchCanvasLazy {...props} />
      </Suspense>
    </CanvasErrorBoundary>
  );
}
