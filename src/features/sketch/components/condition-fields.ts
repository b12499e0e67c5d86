import type { Conditions, ConditionOverrides } from '@shared/model/spool';
import type { Quantity } from '@shared/units/units';
import { roundForEntry, type DisplayUnits } from './display-units';

/** Numeric design-condition fields shown in the forms, with the quantity that sets their unit. */
export const NUMERIC_CONDITION_FIELDS = [
  { name: 'pressure', label: 'Internal design pressure', quantity: 'pressure' },
  { name: 'temperature', label: 'Design temperature', quantity: 'temperature' },
  { name: 'externalPressure', label: 'External design pressure', quantity: 'pressure' },
  { name: 'corrosionAllowance', label: 'Corrosion allowance', quantity: 'length' },
  {
    name: 'millTolerance',
    label: 'Mill under-tolerance',
    quantity: null,
    hint: 'fraction of nominal wall, e.g. 0.125',
  },
  {
    name: 'stiffenedLength',
    label: 'Stiffened length',
    quantity: 'length',
    hint: 'between stiffeners, for external pressure',
  },
  {
    name: 'allowableStress',
    label: 'Allowable stress S',
    quantity: 'pressure',
    hint: 'overrides the material table',
  },
] as const satisfies readonly {
  name: keyof Conditions;
  label: string;
  quantity: Quantity | null;
  hint?: string;
}[];

export type NumericConditionField = (typeof NUMERIC_CONDITION_FIELDS)[number]['name'];

export const CONDITION_LABELS: Record<string, string> = {
  ...Object.fromEntries(NUMERIC_CONDITION_FIELDS.map((f) => [f.name, f.label])),
  material: 'Material',
  productForm: 'Product form',
};

/** Form values: numbers in display units; empty means "not given" (for overrides: inherit). */
export type ConditionFormValues = {
  [K in NumericConditionField]?: number;
} & { material?: string; productForm?: Conditions['productForm'] };

/** Empty or blank input → undefined; anything else → Number (NaN reports "must be a number"). */
export const parseNumberInput = (v: unknown): number | undefined => {
  if (v === undefined || v === null) return undefined;
  if (typeof v === 'number') return v;
  const s = String(v).trim();
  return s === '' ? undefined : Number(s.replace(',', '.'));
};

export const parseTextInput = (v: unknown): string | undefined => {
  const s = typeof v === 'string' ? v.trim() : '';
  return s === '' ? undefined : s;
};

/** Stored conditions → form values in display units. */
export function conditionsToForm(
  c: ConditionOverrides | undefined,
  units: DisplayUnits,
): ConditionFormValues {
  const out: Record<string, unknown> = { material: c?.material, productForm: c?.productForm };
  for (const f of NUMERIC_CONDITION_FIELDS) {
    const v = c?.[f.name];
    out[f.name] =
      v === undefined ? undefined : f.quantity ? roundForEntry(units.toDisplay(v, f.quantity)) : v;
  }
  return out as ConditionFormValues;
}

/**
 * Form values → stored conditions. Only fields the user changed are converted back, so an
 * untouched value keeps its exact stored number even when shown rounded in other units.
 */
export function formToConditions(
  values: ConditionFormValues,
  original: ConditionOverrides | undefined,
  isDirty: (name: string) => boolean,
  units: DisplayUnits,
): ConditionOverrides {
  const out: Record<string, unknown> = { ...original };
  for (const f of NUMERIC_CONDITION_FIELDS) {
    if (!isDirty(f.name)) continue;
    const v = values[f.name];
    out[f.name] = v === undefined ? undefined : f.quantity ? units.fromDisplay(v, f.quantity) : v;
  }
  if (isDirty('material')) out.material = values.material;
  if (isDirty('productForm')) out.productForm = values.productForm;
  for (const k of Object.keys(out)) if (out[k] === undefined) delete out[k];
  return out as ConditionOverrides;
}

/** "Design temperature" + "must be a number" → "Design temperature must be a number". */
export function fieldMessage(label: string, message: string | undefined): string | undefined {
  return message ? `${label} ${message}` : undefined;
}
