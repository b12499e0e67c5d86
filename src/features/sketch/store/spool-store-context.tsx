import { createContext, useContext, useMemo, useState, type ReactNode } from 'react';
import { useStore } from 'zustand';
import { checkSpool, type SpoolCheck } from '@shared/engine';
import type { SpoolDocument } from '@shared/model/spool';
import { createSpoolStore, type SpoolStore, type SpoolStoreState } from './spool-store';

const SpoolStoreContext = createContext<SpoolStore | null>(null);

export interface SpoolStoreProviderProps {
  /** A store made by the caller (e.g. to load server data into it); else one is made from `initial` once. */
  readonly store?: SpoolStore;
  readonly initial?: SpoolDocument;
  readonly children: ReactNode;
}

/**
 * Provides one editor store to the sketch page's canvas and panels. Remount (change `key`)
 * to start over with a new spool, or call `store.getState().load(doc)`.
 */
export function SpoolStoreProvider({ store, initial, children }: SpoolStoreProviderProps) {
  const [own] = useState(() => store ?? createSpoolStore(initial));
  return <SpoolStoreContext.Provider value={store ?? own}>{children}</SpoolStoreContext.Provider>;
}

/** The store instance of the nearest provider (for imperative calls: `useSpoolStoreApi().getState().undo()`). */
export function useSpoolStoreApi(): SpoolStore {
  const store = useContext(SpoolStoreContext);
  if (!store) throw new Error('useSpoolStore must be used inside <SpoolStoreProvider>');
  return store;
}

/**
 * Read a slice of the editor store; re-renders when the selected value changes (Object.is).
 * Select primitives or stable references; for a new object/array per call wrap the selector
 * in zustand's `useShallow`.
 * @example const doc = useSpoolStore((s) => s.doc); const addLeg = useSpoolStore((s) => s.addLeg);
 */
export function useSpoolStore<T>(selector: (state: SpoolStoreState) => T): T {
  return useStore(useSpoolStoreApi(), selector);
}

/** The check of the current document, derived with `checkSpool` (memoised on the document; never stored). */
export function useSpoolCheck(): SpoolCheck {
  const doc = useSpoolStore((s) => s.doc);
  return useMemo(() => checkSpool(doc), [doc]);
}
