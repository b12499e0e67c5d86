import { createContext, useContext, useMemo, useState, type ReactNode } from 'react';
import { useStore } from 'zustand';
import { createSpoolChecker, type CheckOptions, type SpoolCheck } from '@shared/engine';
import type { SpoolDocument } from '@shared/model/spool';
import { createSpoolStore, type SpoolStore, type SpoolStoreState } from './spool-store';

const SpoolStoreContext = createContext<SpoolStore | null>(null);
export const CheckOptionsContext = createContext<CheckOptions | undefined>(undefined);
const FixedCheckContext = createContext<SpoolCheck | undefined>(undefined);

export interface SpoolStoreProviderProps {
  /** A store made by the caller (e.g. to load server data into it); else one is made from `initial` once. */
  readonly store?: SpoolStore;
  readonly initial?: SpoolDocument;
  /** Options of the derived check, e.g. `findMaterial` with the team's materials (keep the object stable). */
  readonly checkOptions?: CheckOptions;
  /** A check computed elsewhere (e.g. the server's, for a read-only shared revision); used instead of checking here. */
  readonly check?: SpoolCheck;
  readonly children: ReactNode;
}

/**
 * Provides one editor store to the sketch page's canvas and panels. Remount (change `key`)
 * to start over with a new spool, or call `store.getState().load(doc)`.
 */
export function SpoolStoreProvider({
  store,
  initial,
  checkOptions,
  check,
  children,
}: SpoolStoreProviderProps) {
  const [own] = useState(() => store ?? createSpoolStore(initial));
  return (
    <SpoolStoreContext.Provider value={store ?? own}>
      <CheckOptionsContext.Provider value={checkOptions}>
        <FixedCheckContext.Provider value={check}>{children}</FixedCheckContext.Provider>
      </CheckOptionsContext.Provider>
    </SpoolStoreContext.Provider>
  );
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

// One memoising checker per store (and check options), shared by every component that reads
// the check: the store keeps unchanged elements as the same objects, so only edited elements
// are re-checked.
interface CheckerEntry {
  readonly options: CheckOptions | undefined;
  readonly check: (doc: SpoolDocument) => SpoolCheck;
  doc?: SpoolDocument;
  result?: SpoolCheck;
}
const checkers = new WeakMap<SpoolStore, CheckerEntry>();

/** Check a document with the store's shared memoising checker. */
export function checkWithStore(
  store: SpoolStore,
  doc: SpoolDocument,
  options?: CheckOptions,
): SpoolCheck {
  let entry = checkers.get(store);
  if (!entry || entry.options !== options) {
    entry = { options, check: createSpoolChecker(options) };
    checkers.set(store, entry);
  }
  if (entry.doc !== doc || !entry.result) {
    entry.result = entry.check(doc);
    entry.doc = doc;
  }
  return entry.result;
}

/** The check of the current document (`checkSpool` of the document, memoised; never stored). */
export function useSpoolCheck(): SpoolCheck {
  const store = useSpoolStoreApi();
  const options = useContext(CheckOptionsContext);
  const fixed = useContext(FixedCheckContext);
  const doc = useSpoolStore((s) => s.doc);
  return useMemo(() => fixed ?? checkWithStore(store, doc, options), [fixed, store, doc, options]);
}
