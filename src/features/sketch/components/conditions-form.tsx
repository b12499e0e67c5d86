import { useEffect } from 'react';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import type { z } from 'zod';
import {
  conditionsSchema,
  PRODUCT_FORMS,
  type Conditions,
  type ConditionOverrides,
} from '@shared/model/spool';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import {
  conditionsToForm,
  fieldMessage,
  formToConditions,
  NUMERIC_CONDITION_FIELDS,
  parseNumberInput,
  parseTextInput,
  type ConditionFormValues,
} from './condition-fields';
import { useDisplayUnits } from './display-units';
import { useMaterialChoices, type MaterialChoice } from './material-choices';

const PRODUCT_FORM_LABELS: Record<string, string> = {
  seamless: 'Seamless',
  erw: 'Electric resistance welded',
  'efw-single': 'Electric fusion welded, single butt',
  'efw-double': 'Electric fusion welded, double butt',
  'efw-spot-rt': 'Electric fusion welded, spot radiographed',
  'efw-full-rt': 'Electric fusion welded, fully radiographed',
  'furnace-butt': 'Furnace butt welded',
};

/** Picker rows, plus the current value when it is not among them (so it is never dropped silently). */
export const materialOptions = (
  choices: readonly MaterialChoice[],
  emptyLabel: string,
  current?: string,
) => [
  { value: '', label: emptyLabel },
  ...(current && !choices.some((m) => m.id === current)
    ? [{ value: current, label: `${current} (not in the library)` }]
    : []),
  ...choices.map((m) => ({ value: m.id, label: m.label })),
];

export const productFormOptions = (emptyLabel: string) => [
  { value: '', label: emptyLabel },
  ...PRODUCT_FORMS.map((p) => ({ value: p, label: PRODUCT_FORM_LABELS[p] ?? p })),
];

/** Spool conditions as typed: the shared schema plus the document-level rule on material. */
export const spoolConditionsFormSchema = conditionsSchema.superRefine((c, ctx) => {
  if (c.material === undefined && c.allowableStress === undefined) {
    ctx.addIssue({
      code: 'custom',
      path: ['material'],
      message: 'must be chosen (or give an allowable stress S)',
    });
  }
});

interface FieldsProps {
  readonly register: UseFormRegister<ConditionFormValues>;
  readonly errors: FieldErrors<ConditionFormValues>;
  readonly disabled?: boolean;
  /** Overrides: an empty field inherits; the placeholder shows the spool's value. */
  readonly inherited?: ConditionOverrides;
  readonly only?: readonly string[];
  /** Material currently stored in this form (kept as an option when not in the library). */
  readonly currentMaterial?: string;
}

/** The design-condition inputs, shared by the spool form and the element overrides. */
export function ConditionInputs({
  register,
  errors,
  disabled,
  inherited,
  only,
  currentMaterial,
}: FieldsProps) {
  const units = useDisplayUnits();
  const choices = useMaterialChoices();
  const shown = (name: string) => !only || only.includes(name);
  const placeholderOf = (
    name: keyof Conditions,
    quantity: 'length' | 'pressure' | 'temperature' | null,
  ) => {
    if (!inherited) return undefined;
    const v = inherited[name];
    if (typeof v === 'number')
      return `inherit ${quantity ? Number(units.toDisplay(v, quantity).toPrecision(5)) : v}`;
    if (typeof v === 'string') return `inherit ${v}`;
    return 'inherit';
  };
  const inheritLabel = inherited ? 'inherit from spool' : '(none)';
  return (
    <div className="grid grid-cols-2 gap-x-3 gap-y-2">
      {NUMERIC_CONDITION_FIELDS.filter((f) => shown(f.name)).map((f) => (
        <TextField
          key={f.name}
          label={f.label}
          unit={f.quantity ? units.label(f.quantity) : undefined}
          inputMode="decimal"
          autoComplete="off"
          disabled={disabled}
          placeholder={placeholderOf(f.name, f.quantity)}
          hint={'hint' in f ? f.hint : undefined}
          error={fieldMessage(f.label, errors[f.name]?.message)}
          {...register(f.name, { setValueAs: parseNumberInput })}
        />
      ))}
      {shown('material') ? (
        <SelectField
          className="col-span-2"
          label="Material"
          disabled={disabled}
          options={materialOptions(
            choices,
            inherited
              ? `${inheritLabel}${inherited.material ? ` (${inherited.material})` : ''}`
              : 'choose a material…',
            currentMaterial,
          )}
          error={fieldMessage('Material', errors.material?.message)}
          {...register('material', { setValueAs: parseTextInput })}
        />
      ) : null}
      {shown('productForm') ? (
        <SelectField
          className="col-span-2"
          label="Product form"
          disabled={disabled}
          options={productFormOptions(inherited ? inheritLabel : 'seamless (default)')}
          error={fieldMessage('Product form', errors.productForm?.message)}
          {...register('productForm', { setValueAs: parseTextInput })}
        />
      ) : null}
    </div>
  );
}

export interface ConditionsFormProps {
  readonly conditions: Conditions;
  readonly onApply: (next: Conditions) => void;
  readonly readOnly?: boolean;
}

/** Design conditions of the whole spool (every element inherits them unless it overrides). */
export function ConditionsForm({ conditions, onApply, readOnly }: ConditionsFormProps) {
  const units = useDisplayUnits();
  const form = useForm<ConditionFormValues>({
    resolver: zodResolver(
      spoolConditionsFormSchema as unknown as z.ZodType<ConditionFormValues, ConditionFormValues>,
    ),
    mode: 'onChange',
    defaultValues: conditionsToForm(conditions, units),
  });
  const { reset } = form;
  // A new document (undo, reload, import) or a units switch refreshes the form.
  useEffect(() => {
    reset(conditionsToForm(conditions, units));
  }, [conditions, units, reset]);

  const submit = form.handleSubmit((values) => {
    const dirty = form.formState.dirtyFields as Record<string, unknown>;
    const next = formToConditions(
      values,
      conditions,
      (n) => Boolean(dirty[n]),
      units,
    ) as Conditions;
    onApply(next);
  });

  return (
    <form
      aria-label="Design conditions"
      noValidate
      onSubmit={(e) => void submit(e)}
      className="flex flex-col gap-3"
    >
      <ConditionInputs
        register={form.register}
        errors={form.formState.errors}
        disabled={readOnly}
        currentMaterial={conditions.material}
      />
      {readOnly ? null : (
        <div className="flex gap-2">
          <Button type="submit" variant="primary" size="sm" disabled={!form.formState.isDirty}>
            Apply conditions
          </Button>
          <Button
            size="sm"
            variant="ghost"
            disabled={!form.formState.isDirty}
            onClick={() => reset(conditionsToForm(conditions, units))}
          >
            Discard
          </Button>
        </div>
      )}
    </form>
  );
}
