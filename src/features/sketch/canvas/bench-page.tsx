import { useState } from 'react';
import { createSpoolStore } from '../store/spool-store';
import { SpoolStoreProvider } from '../store/spool-store-context';
import type { DimensionMode } from '../store/spool-store';
import { generateBenchSpool } from './bench-spool';
import { SketchCanvas } from './sketch-canvas';

/**
 * Benchmark page: a generated spool in a fixed 1280 × 720 canvas. Query: `n` elements
 * (default 300), `aa=1` antialiasing, `labels=auto|all|none`, `legend=0` hides the status key.
 */
export function CanvasBenchPage() {
  const [store] = useState(() => {
    const params = new URLSearchParams(window.location.search);
    const n = Math.max(1, Math.min(20_000, Number(params.get('n') ?? 300) || 300));
    const s = createSpoolStore(generateBenchSpool(n));
    s.getState().setAntialias(params.get('aa') === '1');
    const labels = params.get('labels');
    if (labels === 'all' || labels === 'none' || labels === 'auto')
      s.getState().setShowDimensions(labels as DimensionMode);
    return s;
  });
  const [legend] = useState(
    () => new URLSearchParams(window.location.search).get('legend') !== '0',
  );
  return (
    <SpoolStoreProvider store={store}>
      <div style={{ width: 1280, height: 720 }} data-testid="canvas-bench">
        <SketchCanvas showLegend={legend} />
      </div>
    </SpoolStoreProvider>
  );
}
