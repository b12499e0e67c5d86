// @vitest-environment jsdom
import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import { createSpoolStore } from '@/features/sketch/store/spool-store';
import { SpoolStoreProvider } from '@/features/sketch/store/spool-store-context';
import { SketchCanvasView } from '@/features/sketch/canvas/sketch-canvas-view';
import { StatusLegend } from '@/features/sketch/canvas/status-legend';

describe('SketchCanvasView without WebGL (jsdom)', () => {
  it('shows a loading line, then a fallback instead of breaking the page', async () => {
    // jsdom has no WebGL: three.js and React report the failure through console.error.
    vi.spyOn(console, 'error').mockImplementation(() => {});
    vi.spyOn(console, 'warn').mockImplementation(() => {});
    const store = createSpoolStore();
    render(
      <SpoolStoreProvider store={store}>
        <div style={{ width: 400, height: 300 }}>
          <SketchCanvasView />
        </div>
      </SpoolStoreProvider>,
    );
    expect(screen.getByTestId('sketch-canvas-loading')).toBeTruthy();
    expect(
      await screen.findByTestId('sketch-canvas-error', undefined, { timeout: 20_000 }),
    ).toBeTruthy();
  });
});

describe('StatusLegend', () => {
  it('names every status with a glyph and its count', () => {
    render(<StatusLegend summary={{ pass: 3, marginal: 1, fail: 2, review: 0, invalid: 0 }} />);
    const legend = screen.getByTestId('status-legend');
    expect(legend.textContent).toContain('✓Pass3');
    expect(legend.textContent).toContain('✕Fail2');
    expect(legend.querySelectorAll('li')).toHaveLength(5);
  });
});
