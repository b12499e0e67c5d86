import { useState } from 'react';
import { zodResolver } from '@hookform/resolvers/zod';
import { useFieldArray, useForm, type FieldError } from 'react-hook-form';
import { PRODUCT_FORMS } from '@shared/model/spool';
import {
  MATERIAL_CATEGORIES,
  MODULUS_GROUPS,
  W_FAMILIES,
  Y_FAMILIES,
  teamMaterialInputSchema,
  type TeamMaterialInput,
  type TeamMaterialValues,
} from '@shared/model/team-material';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { applyServerErrors } from '@/lib/form-errors';
import { useAddMaterial } from '../api/add-material';
import { RecheckNote } from './recheck-note';

const asOptions = (xs: readonly string[]) => xs.map((x) => ({ value: x, label: x }));
/** Empty number inputs are "not given" (undefined), so the schema says which one is missing. */
const numberOrUndefined = (v: unknown) =>
  v === '' || v === null || v === undefined ? undefined : Number(v);
const say = (label: string, e: FieldError | undefined) =>
  e?.message ? `${label} ${e.message}` : undefined;

const FIELDS = [
  'id',
  'spec',
  'grade',
  'name',
  'category',
  'yFamily',
  'wFamily',
  'modulusGroup',
  'productForms',
  'tensileKsi',
  'yieldKsi',
  'points',
  'sourceNote',
  'fromMemory',
];

const EMPTY: TeamMaterialInput = {
  id: '',
  spec: '',
  grade: '',
  name: '',
  category: 'carbon',
  yFamily: 'ferritic',
  wFamily: 'carbon',
  modulusGroup: 'carbon',
  productForms: ['seamless'],
  tensileKsi: undefined as unknown as number,
  yieldKsi: undefined as unknown as number,
  points: [{ tempF: undefined as unknown as number, stressKsi: undefined as unknown as number }],
  sourceNote: '',
  fromMemory: false,
};

/** One team material by hand: identity, strengths, S(T) rows, the required source note. */
export function MaterialForm() {
  const add = useAddMaterial();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<TeamMaterialInput, unknown, TeamMaterialValues>({
    resolver: zodResolver(teamMaterialInputSchema),
    defaultValues: EMPTY,
  });
  const points = useFieldArray({ control: form.control, name: 'points' });
  const { errors } = form.formState;
  const num = { setValueAs: numberOrUndefined };

  const onSubmit = form.handleSubmit((values) => {
    setFormError(null);
    add.mutate(values, {
      onSuccess: () => form.reset(EMPTY),
      onError: (e) => {
        const rest = applyServerErrors(e, form.setError, FIELDS);
        if (rest.length > 0) setFormError(rest.join('; '));
      },
    });
  });

  return (
    <form
      aria-label="Add a team material"
      onSubmit={(e) => void onSubmit(e)}
      noValidate
      className="flex flex-col gap-4"
    >
      <div className="grid grid-cols-4 gap-3">
        <TextField
          label="Material id"
          hint="What spools refer to, e.g. KX-CS-70"
          {...form.register('id')}
          error={say('Material id', errors.id)}
        />
        <TextField
          label="Specification"
          {...form.register('spec')}
          error={say('Specification', errors.spec)}
        />
        <TextField label="Grade" {...form.register('grade')} error={say('Grade', errors.grade)} />
        <TextField
          label="Name"
          hint="Optional; spec and grade when empty"
          {...form.register('name')}
          error={say('Name', errors.name)}
        />
        <SelectField
          label="Category"
          options={asOptions(MATERIAL_CATEGORIES)}
          {...form.register('category')}
          error={say('Category', errors.category)}
        />
        <SelectField
          label="Y coefficient family"
          options={asOptions(Y_FAMILIES)}
          {...form.register('yFamily')}
          error={say('Y coefficient family', errors.yFamily)}
        />
        <SelectField
          label="Weld strength family"
          options={asOptions(W_FAMILIES)}
          {...form.register('wFamily')}
          error={say('Weld strength family', errors.wFamily)}
        />
        <SelectField
          label="Modulus group"
          options={asOptions(MODULUS_GROUPS)}
          {...form.register('modulusGroup')}
          error={say('Modulus group', errors.modulusGroup)}
        />
        <TextField
          label="Tensile strength"
          unit="ksi"
          type="number"
          step="any"
          {...form.register('tensileKsi', num)}
          error={say('Tensile strength', errors.tensileKsi)}
        />
        <TextField
          label="Yield strength"
          unit="ksi"
          type="number"
          step="any"
          {...form.register('yieldKsi', num)}
          error={say('Yield strength', errors.yieldKsi)}
        />
      </div>
      <fieldset className="flex flex-wrap items-center gap-x-4 gap-y-1">
        <legend className="mb-1 text-xs font-medium text-steel-600">Product forms</legend>
        {PRODUCT_FORMS.map((f) => (
          <label key={f} className="flex items-center gap-1 text-sm text-steel-700">
            <input type="checkbox" value={f} {...form.register('productForms')} />
            {f}
          </label>
        ))}
        {errors.productForms ? (
          <p role="alert" className="w-full text-xs text-red-700">
            Product forms: {errors.productForms.message ?? errors.productForms.root?.message}
          </p>
        ) : null}
      </fieldset>
      <fieldset>
        <legend className="mb-1 text-xs font-medium text-steel-600">
          Allowable stress by temperature
        </legend>
        <div className="flex flex-col gap-2">
          {points.fields.map((field, i) => (
            <div
              key={field.id}
              className="grid grid-cols-[12rem_12rem_12rem_auto] items-start gap-3"
              data-point-row={i + 1}
            >
              <TextField
                label={`Row ${i + 1}: temperature`}
                unit="°F"
                type="number"
                step="any"
                {...form.register(`points.${i}.tempF`, num)}
                error={say(`Row ${i + 1} temperature`, errors.points?.[i]?.tempF)}
              />
              <TextField
                label={`Row ${i + 1}: allowable stress S`}
                unit="ksi"
                type="number"
                step="any"
                {...form.register(`points.${i}.stressKsi`, num)}
                error={say(`Row ${i + 1} allowable stress`, errors.points?.[i]?.stressKsi)}
              />
              <TextField
                label={`Row ${i + 1}: yield at temperature`}
                unit="ksi, optional"
                type="number"
                step="any"
                {...form.register(`points.${i}.yieldAtKsi`, num)}
                error={say(`Row ${i + 1} yield`, errors.points?.[i]?.yieldAtKsi)}
              />
              <Button
                size="sm"
                variant="ghost"
                className="mt-5"
                disabled={points.fields.length <= 1}
                onClick={() => points.remove(i)}
                aria-label={`Remove row ${i + 1}`}
              >
                Remove
              </Button>
            </div>
          ))}
          {errors.points?.message || errors.points?.root?.message ? (
            <p role="alert" className="text-xs text-red-700">
              Temperature rows: {errors.points.message ?? errors.points.root?.message}
            </p>
          ) : null}
          <div>
            <Button
              size="sm"
              onClick={() =>
                points.append({
                  tempF: undefined as unknown as number,
                  stressKsi: undefined as unknown as number,
                })
              }
            >
              Add a temperature row
            </Button>
          </div>
        </div>
      </fieldset>
      <div className="grid grid-cols-[1fr_auto] items-start gap-3">
        <TextField
          label="Source note"
          hint="Required: the table, edition or document the values come from"
          {...form.register('sourceNote')}
          error={say('Source note', errors.sourceNote)}
        />
        <label className="mt-5 flex items-center gap-2 text-sm text-steel-700">
          <input type="checkbox" {...form.register('fromMemory')} />
          Values recalled from memory (flag every row)
        </label>
      </div>
      {formError ? (
        <p role="alert" className="text-sm text-red-700">
          {formError}
        </p>
      ) : null}
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={add.isPending}>
          {add.isPending ? 'Adding…' : 'Add material'}
        </Button>
        {add.isSuccess ? (
          <p role="status" className="text-sm text-emerald-800">
            Added {add.data.item.id}
            {add.data.replaces === 'library'
              ? ' (replaces the built-in row for this team)'
              : ''}. <RecheckNote result={add.data} />
          </p>
        ) : null}
      </div>
    </form>
  );
}
