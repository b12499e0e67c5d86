// @vitest-environment jsdom
import { describe, expect, it, vi } from 'vitest';
import { act, renderHook } from '@testing-library/react';
import type { ReactNode } from 'react';
import { createSpoolStore } from '@/features/sketch/store/spool-store';
import {
  SpoolStoreProvider,
  useSpoolCheck,
  useSpoolStore,
} from '@/features/sketch/store/spool-store-context';

const make = () => {
  const store = createSpoolStore({
    units: 'imperial',
    conditions: { pressure: 300, temperature: 200, material: 'A106-B' },
    elements: [],
  });
  store.getState().startRun({ nps: '2', schedule: '40' }, { history: 'never' });
  store.getState().addLeg('east', 100);
  return store;
};

describe('SpoolStoreProvider', () => {
  it('derives the check from the document and re-checks after an edit', () => {
    const store = make();
    const wrapper = ({ children }: { children: ReactNode }) => (
      <SpoolStoreProvider store={store}>{children}</SpoolStoreProvider>
    );
    const { result, rerender } = renderHook(
      () => ({ check: useSpoolCheck(), count: useSpoolStore((s) => s.doc.elements.length) }),
      { wrapper },
    );
    expect(result.current.count).toBe(1);
    expect(result.current.check.elements.map((e) => e.id)).toEqual(['S1']);
    const first = result.current.check;
    rerender();
    expect(result.current.check).toBe(first);
    act(() => {
      store.getState().addLeg('north', 50);
    });
    expect(result.current.count).toBe(3);
    expect(result.current.check.elements.map((e) => e.id)).toEqual(['S1', 'B1', 'S2']);
    // S1 (shortened by the bend's tangent) was re-checked; after the next leg it is unchanged
    // and keeps its result object (the checker is memoised per element).
    const second = result.current.check;
    expect(second.elements[0]).not.toBe(first.elements[0]);
    act(() => {
      store.getState().addLeg('up', 50);
    });
    expect(result.current.check.elements[0]).toBe(second.elements[0]);
  });

  it('makes its own store from `initial` when none is given', () => {
    const wrapper = ({ children }: { children: ReactNode }) => (
      <SpoolStoreProvider
        initial={{
          units: 'metric',
          conditions: { pressure: 1, temperature: 20, material: 'A106-B' },
          elements: [],
        }}
      >
        {children}
      </SpoolStoreProvider>
    );
    const { result } = renderHook(() => useSpoolStore((s) => s.doc.units), { wrapper });
    expect(result.current).toBe('metric');
  });

  it('throws a clear error outside a provider', () => {
    // React reports the thrown render error through console.error: expected here.
    vi.spyOn(console, 'error').mockImplementation(() => {});
    expect(() => renderHook(() => useSpoolStore((s) => s.doc))).toThrow(
      /inside <SpoolStoreProvider>/,
    );
  });
});
