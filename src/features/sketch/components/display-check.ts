import { useContext, useMemo } from 'react';
import { checkSpool, type CheckOptions } from '@shared/engine';
import type { ElementCheck } from '@shared/engine/types';
import type {
  ConditionOverrides,
  Conditions,
  SpoolDocument,
  SpoolElement,
  UnitSystem,
} from '@shared/model/spool';
import { getPipeWall, normalizeNps } from '@shared/data/pipe-dimensions';
import { convert, type Quantity } from '@shared/units/units';
import { resolveOutsideDiameter } from '../geometry/pipe-size';
import { CheckOptionsContext } from '../store/spool-store-context';
import { useDisplayUnits } from './display-units';

/*
 * The equation trail in display units. The engine writes each trail step's substituted
 * values as text in the document's units, so converting the text afterwards cannot know
 * which number is which quantity. Instead the element is checked again as a one-element
 * document restated in the display units (every length, pressure, stress and temperature
 * converted): the engine then substitutes display-unit values itself. Materials are looked
 * up by name as before (tables are stored as published and converted by the engine).
 */

const CONDITION_QUANTITIES: Partial<Record<keyof Conditions, Quantity>> = {
  pressure: 'pressure',
  temperature: 'temperature',
  externalPressure: 'pressure',
  allowableStress: 'pressure',
  yieldStrength: 'pressure',
  elasticModulus: 'pressure',
  corrosionAllowance: 'length',
  millToleranceLength: 'length',
  stiffenedLength: 'length',
  grooveDepth: 'length',
};

function convertConditions<T extends ConditionOverrides>(
  c: T,
  from: UnitSystem,
  to: UnitSystem,
): T {
  const out: Record<string, unknown> = { ...c };
  for (const [key, q] of Object.entries(CONDITION_QUANTITIES) as [keyof Conditions, Quantity][]) {
    const v = c[key];
    if (typeof v === 'number') out[key] = convert(v, q, from, to);
  }
  return out as T;
}

/** An element restated in another unit system (lengths and its condition overrides). */
export function convertElementUnits(
  el: SpoolElement,
  from: UnitSystem,
  to: UnitSystem,
): SpoolElement {
  if (from === to) return el;
  const len = (v: number) => convert(v, 'length', from, to);
  const out: Record<string, unknown> = { ...el };
  for (const key of ['outsideDiameter', 'insideDiameter', 'nominalWall'] as const) {
    const v = el[key];
    if (v !== undefined) out[key] = len(v);
  }
  if (el.conditions) out.conditions = convertConditions(el.conditions, from, to);
  if (el.kind === 'straight') out.length = len(el.length);
  else if (typeof el.bendRadius === 'number') out.bendRadius = len(el.bendRadius);
  return out as unknown as SpoolElement;
}

/** A document restated in another unit system; the same object when the systems agree. */
export function convertDocumentUnits(doc: SpoolDocument, to: UnitSystem): SpoolDocument {
  const from = doc.units;
  if (from === to) return doc;
  const len = (v: number) => convert(v, 'length', from, to);
  return {
    ...doc,
    units: to,
    conditions: convertConditions(doc.conditions, from, to),
    ...(doc.origin
      ? { origin: { x: len(doc.origin.x), y: len(doc.origin.y), z: len(doc.origin.z) } }
      : {}),
    ...(typeof doc.defaultBendRadius === 'number'
      ? { defaultBendRadius: len(doc.defaultBendRadius) }
      : {}),
    elements: doc.elements.map((e) => convertElementUnits(e, from, to)),
  };
}

/**
 * The element with its NPS/schedule dimensions written out (document units): the metric and
 * imperial columns of ASME B36.10M are rounded separately (NPS 2: 2.375 in, 60.3 mm), so a
 * restated element keeps the exact dimensions its document uses. NPS stays for bend radii
 * given as multiples of it and for the wall-before-bending table.
 */
export function pinDimensions(el: SpoolElement, units: UnitSystem): SpoolElement {
  const n = el.nps !== undefined ? normalizeNps(el.nps) : undefined;
  const wall = n && el.schedule !== undefined ? getPipeWall(n, String(el.schedule)) : undefined;
  const out: Record<string, unknown> = { ...el };
  if (el.outsideDiameter === undefined) {
    const od = resolveOutsideDiameter(el, units);
    if (od !== undefined && n) out.outsideDiameter = od;
  }
  if (el.nominalWall === undefined && wall)
    out.nominalWall = units === 'imperial' ? wall.wallIn : wall.wallMm;
  return out as unknown as SpoolElement;
}

/** Check one element of `doc` as restated in `display` units (see above). */
export function checkElementInUnits(
  doc: SpoolDocument,
  el: SpoolElement,
  display: UnitSystem,
  options?: CheckOptions,
): ElementCheck | undefined {
  const one = convertDocumentUnits({ ...doc, elements: [pinDimensions(el, doc.units)] }, display);
  return checkSpool(one, options).elements[0];
}

/**
 * The element's check with its trail in the display units: `base` itself when the display
 * shows the document's units, else the element checked again in the display units.
 */
export function useDisplayUnitCheck(
  doc: SpoolDocument,
  el: SpoolElement | undefined,
  base: ElementCheck | undefined,
): ElementCheck | undefined {
  const units = useDisplayUnits();
  const options = useContext(CheckOptionsContext);
  const conditions = doc.conditions;
  return useMemo(() => {
    if (!el || !base || units.display === doc.units) return base;
    return checkElementInUnits({ ...doc, elements: [] }, el, units.display, options);
    // The element, the spool conditions and the units decide the result, not other elements.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [el, base, units.display, doc.units, conditions, options]);
}
