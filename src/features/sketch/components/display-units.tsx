import { createContext, useContext, useMemo, type ReactNode } from 'react';
import type { UnitSystem } from '@shared/model/spool';
import { convert, UNIT_LABELS, type Quantity } from '@shared/units/units';

/**
 * Display units: what the user reads and types. The document keeps its own `units`; every value
 * is converted on the way to the screen and back on entry, so stored numbers keep their meaning.
 */
export interface DisplayUnits {
  /** Unit system of the document (what is stored). */
  readonly doc: UnitSystem;
  /** Unit system shown on screen. */
  readonly display: UnitSystem;
  /** Document value → display value. */
  readonly toDisplay: (value: number, quantity: Quantity) => number;
  /** Display value → document value. */
  readonly fromDisplay: (value: number, quantity: Quantity) => number;
  /** Display unit label of a quantity, e.g. "mm". */
  readonly label: (quantity: Quantity) => string;
  /** Convert a result value whose unit label is in document units (e.g. a trail step's unit). */
  readonly showUnit: (value: number, docUnit: string) => { value: number; unit: string };
}

export function makeDisplayUnits(doc: UnitSystem, display: UnitSystem): DisplayUnits {
  const docLabels = UNIT_LABELS[doc];
  const quantityOf = (unit: string): Quantity | null =>
    unit === docLabels.length
      ? 'length'
      : unit === docLabels.pressure
        ? 'pressure'
        : unit === docLabels.temperature
          ? 'temperature'
          : null;
  return {
    doc,
    display,
    toDisplay: (v, q) => convert(v, q, doc, display),
    fromDisplay: (v, q) => convert(v, q, display, doc),
    label: (q) => UNIT_LABELS[display][q],
    showUnit: (value, unit) => {
      const q = quantityOf(unit);
      return q
        ? { value: convert(value, q, doc, display), unit: UNIT_LABELS[display][q] }
        : { value, unit };
    },
  };
}

const DisplayUnitsContext = createContext<DisplayUnits>(makeDisplayUnits('imperial', 'imperial'));

export function DisplayUnitsProvider({
  doc,
  display,
  children,
}: {
  doc: UnitSystem;
  display: UnitSystem;
  children: ReactNode;
}) {
  const value = useMemo(() => makeDisplayUnits(doc, display), [doc, display]);
  return <DisplayUnitsContext.Provider value={value}>{children}</DisplayUnitsContext.Provider>;
}

export function useDisplayUnits(): DisplayUnits {
  return useContext(DisplayUnitsContext);
}

/** Round a converted value for an input box so 150 psi shown in MPa is 1.0342, not 1.034213…. */
export function roundForEntry(value: number): number {
  if (!Number.isFinite(value) || value === 0) return value;
  return Number(value.toPrecision(6));
}

const STORAGE_KEY = 'spoolwright.displayUnits';

export function readStoredDisplayUnits(): UnitSystem | null {
  try {
    const v = globalThis.localStorage?.getItem(STORAGE_KEY);
    return v === 'imperial' || v === 'metric' ? v : null;
  } catch {
    return null;
  }
}

export function storeDisplayUnits(units: UnitSystem): void {
  try {
    globalThis.localStorage?.setItem(STORAGE_KEY, units);
  } catch {
    // Private mode or storage disabled: the choice lasts for this page only.
  }
}
