import { useEffect, useMemo } from 'react';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, useWatch } from 'react-hook-form';
import { z } from 'zod';
import {
  getPipeSize,
  getPipeWall,
  listPipeWalls,
  normalizeNps,
  NPS_SIZES,
  SCHEDULES,
} from '@shared/data/pipe-dimensions';
import {
  bendRadiusSchema,
  bendSchema,
  DIRECTIONS,
  END_TYPES,
  straightSchema,
  type Bend,
  type SpoolElement,
  type Straight,
} from '@shared/model/spool';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { fieldMessage, parseNumberInput, parseTextInput } from './condition-fields';
import { describeDirection } from '../geometry/angled-direction';
import { headingToVec } from '../geometry/vec';
import { roundForEntry, useDisplayUnits, type DisplayUnits } from './display-units';

export const ELEMENT_FIELD_LABELS = {
  tag: 'Tag',
  nps: 'NPS',
  schedule: 'Schedule',
  outsideDiameter: 'Outside diameter D',
  insideDiameter: 'Inside diameter d',
  nominalWall: 'Nominal wall T',
  direction: 'Direction',
  length: 'Length',
  endType: 'End type',
  angle: 'Bend angle',
  radiusMode: 'Bend radius given as',
  radiusValue: 'Bend radius',
} as const;

/** The element's editable fields, validated with the shared element schemas' own field rules. */
export const elementFormSchema = z
  .object({
    kind: z.enum(['straight', 'bend']),
    tag: straightSchema.shape.tag,
    // The picker only offers trade designations, so the form holds the string form of the NPS.
    nps: z.string().trim().min(1, 'must not be empty').optional(),
    schedule: z.string().trim().min(1, 'must not be empty').optional(),
    // Explicit dimensions in display units; empty = from NPS and schedule.
    outsideDiameter: z.number().optional(),
    insideDiameter: z.number().optional(),
    nominalWall: z.number().optional(),
    direction: straightSchema.shape.direction,
    length: z.number().optional(),
    endType: straightSchema.shape.endType,
    angle: z.number().optional(),
    radiusMode: z.enum(['multipleOfD', 'length']).optional(),
    radiusValue: z.number().optional(),
  })
  .superRefine((v, ctx) => {
    const check = (schema: z.ZodType, value: unknown, path: string) => {
      const r = schema.safeParse(value);
      if (!r.success)
        ctx.addIssue({
          code: 'custom',
          path: [path],
          message: r.error.issues[0]?.message ?? 'is not valid',
        });
    };
    if (v.kind === 'straight') check(straightSchema.shape.length, v.length, 'length');
    for (const key of ['outsideDiameter', 'insideDiameter', 'nominalWall'] as const)
      if (v[key] !== undefined) check(straightSchema.shape[key], v[key], key);
    const D = v.outsideDiameter;
    const T = v.nominalWall;
    const d = v.insideDiameter;
    const issue = (path: string, message: string) =>
      ctx.addIssue({ code: 'custom', path: [path], message });
    if (v.nps === undefined && D === undefined && d === undefined)
      issue(
        'outsideDiameter',
        'give an outside diameter (or an inside diameter with a wall), or choose an NPS',
      );
    if (v.schedule === undefined && T === undefined)
      issue('nominalWall', 'give a nominal wall, or choose a schedule');
    if (d !== undefined && T === undefined && v.schedule === undefined)
      issue('insideDiameter', 'needs a nominal wall (or a schedule) as well');
    const pos = (x: number | undefined): x is number =>
      x !== undefined && Number.isFinite(x) && x > 0;
    if (pos(D) && pos(T) && T >= D / 2)
      issue('nominalWall', `must be less than half the outside diameter (${roundForEntry(D / 2)})`);
    if (pos(D) && pos(T) && pos(d) && T < D / 2 && Math.abs(D - 2 * T - d) > 1e-6 * D)
      issue('insideDiameter', `must equal D − 2T = ${roundForEntry(D - 2 * T)}, or be left empty`);
    if (v.kind === 'bend') {
      check(bendSchema.shape.angle, v.angle, 'angle');
      check(
        bendRadiusSchema,
        v.radiusMode === 'multipleOfD' ? { multipleOfD: v.radiusValue } : v.radiusValue,
        'radiusValue',
      );
    }
  });
export type ElementFormValues = z.infer<typeof elementFormSchema>;

export function elementToForm(el: SpoolElement, units: DisplayUnits): ElementFormValues {
  const nps = el.nps === undefined ? undefined : (normalizeNps(el.nps) ?? String(el.nps));
  const len = (v: number | undefined) =>
    v === undefined ? undefined : roundForEntry(units.toDisplay(v, 'length'));
  const base = {
    tag: el.tag,
    nps,
    schedule: el.schedule === undefined ? undefined : String(el.schedule),
    outsideDiameter: len(el.outsideDiameter),
    insideDiameter: len(el.insideDiameter),
    nominalWall: len(el.nominalWall),
    direction: el.direction,
  };
  if (el.kind === 'straight') {
    return {
      kind: 'straight',
      ...base,
      length: roundForEntry(units.toDisplay(el.length, 'length')),
      endType: el.endType,
    };
  }
  const r = el.bendRadius;
  return {
    kind: 'bend',
    ...base,
    angle: el.angle,
    radiusMode: typeof r === 'number' ? 'length' : 'multipleOfD',
    radiusValue:
      typeof r === 'number' ? roundForEntry(units.toDisplay(r, 'length')) : r.multipleOfD,
  };
}

/** The changed fields as a patch in document units (untouched values keep their exact stored number). */
export function formToElementPatch(
  values: ElementFormValues,
  el: SpoolElement,
  isDirty: (name: keyof ElementFormValues) => boolean,
  units: DisplayUnits,
): Partial<Straight> | Partial<Bend> {
  const patch: Record<string, unknown> = {};
  if (isDirty('tag')) patch.tag = values.tag;
  if (isDirty('nps')) patch.nps = values.nps;
  if (isDirty('schedule')) patch.schedule = values.schedule;
  if (isDirty('direction')) patch.direction = values.direction;
  for (const key of ['outsideDiameter', 'insideDiameter', 'nominalWall'] as const) {
    if (isDirty(key)) {
      const v = values[key];
      patch[key] = v === undefined ? undefined : units.fromDisplay(v, 'length');
    }
  }
  if (el.kind === 'straight') {
    if (isDirty('length') && values.length !== undefined)
      patch.length = units.fromDisplay(values.length, 'length');
    if (isDirty('endType')) patch.endType = values.endType;
  } else {
    if (isDirty('angle')) patch.angle = values.angle;
    if ((isDirty('radiusValue') || isDirty('radiusMode')) && values.radiusValue !== undefined) {
      patch.bendRadius =
        values.radiusMode === 'multipleOfD'
          ? { multipleOfD: values.radiusValue }
          : units.fromDisplay(values.radiusValue, 'length');
    }
  }
  return patch as Partial<Straight> | Partial<Bend>;
}

const opt = (values: readonly string[], empty?: string) => [
  ...(empty !== undefined ? [{ value: '', label: empty }] : []),
  ...values.map((v) => ({ value: v, label: v })),
];

export interface ElementFormProps {
  readonly element: SpoolElement;
  readonly onApply: (patch: Partial<Straight> | Partial<Bend>) => void;
  readonly readOnly?: boolean;
}

/** Properties of one straight or bend. Enter or "Apply" writes the changed fields (one undo step). */
export function ElementForm({ element, onApply, readOnly }: ElementFormProps) {
  const units = useDisplayUnits();
  const defaults = useMemo(() => elementToForm(element, units), [element, units]);
  const form = useForm<ElementFormValues>({
    resolver: zodResolver(elementFormSchema),
    mode: 'onChange',
    defaultValues: defaults,
  });
  const { reset, register, formState } = form;
  useEffect(() => {
    reset(defaults);
  }, [defaults, reset]);
  const nps = useWatch({ control: form.control, name: 'nps' });
  const radiusMode = useWatch({ control: form.control, name: 'radiusMode' });
  const scheduleChoices = useMemo(() => {
    const listed =
      typeof nps === 'string' && nps !== '' ? listPipeWalls(nps).map((w) => w.schedule) : [];
    const list = listed.length > 0 ? listed : [...SCHEDULES];
    // The stored schedule stays on offer for the stored NPS even when the tables do not list it.
    const current = nps === defaults.nps ? defaults.schedule : undefined;
    return current && !list.includes(current) ? [current, ...list] : list;
  }, [nps, defaults.nps, defaults.schedule]);
  // A new NPS may not list the chosen schedule: pick a listed one rather than show one and keep another.
  const { getValues, setValue } = form;
  useEffect(() => {
    const current = getValues('schedule');
    if (current !== undefined && !scheduleChoices.includes(current)) {
      const fallback = scheduleChoices.find((s) => s === '40' || s === 'STD') ?? scheduleChoices[0];
      if (fallback) setValue('schedule', fallback, { shouldDirty: true, shouldValidate: true });
    }
  }, [scheduleChoices, getValues, setValue]);
  const npsChoices = useMemo(() => {
    const current = defaults.nps;
    return current && !NPS_SIZES.includes(current) ? [current, ...NPS_SIZES] : [...NPS_SIZES];
  }, [defaults.nps]);

  // Table dimensions of the chosen NPS and schedule, shown as what an empty field means.
  const schedule = useWatch({ control: form.control, name: 'schedule' });
  const tableDims = useMemo(() => {
    const n = typeof nps === 'string' && nps !== '' ? normalizeNps(nps) : undefined;
    if (!n) return undefined;
    const w = schedule ? getPipeWall(n, schedule) : undefined;
    const size = getPipeSize(n);
    const show = (inches: number | undefined, mm: number | undefined) => {
      const v = units.doc === 'imperial' ? inches : mm;
      return v === undefined
        ? undefined
        : `${roundForEntry(units.toDisplay(v, 'length'))} ${units.label('length')}`;
    };
    return {
      od: show(w?.odIn ?? size?.odIn, w?.odMm ?? size?.odMm),
      wall: show(w?.wallIn, w?.wallMm),
    };
  }, [nps, schedule, units]);
  const errors = formState.errors;
  const msg = (name: keyof typeof ELEMENT_FIELD_LABELS) =>
    fieldMessage(ELEMENT_FIELD_LABELS[name], errors[name]?.message);
  const submit = form.handleSubmit((values) => {
    const dirty = formState.dirtyFields as Record<string, unknown>;
    const patch = formToElementPatch(values, element, (n) => Boolean(dirty[n]), units);
    if (Object.keys(patch).length > 0) onApply(patch);
  });

  return (
    <form
      aria-label="Element properties"
      noValidate
      onSubmit={(e) => void submit(e)}
      className="flex flex-col gap-3"
    >
      <div className="grid grid-cols-2 gap-x-3 gap-y-2">
        <SelectField
          label="NPS"
          disabled={readOnly}
          options={opt(npsChoices, '(none: explicit diameter)')}
          error={msg('nps')}
          {...register('nps', { setValueAs: parseTextInput })}
        />
        <SelectField
          label="Schedule"
          disabled={readOnly}
          options={opt(scheduleChoices, '(none: explicit wall)')}
          error={msg('schedule')}
          {...register('schedule', { setValueAs: parseTextInput })}
        />
        <TextField
          label="Outside diameter D"
          unit={units.label('length')}
          hint={
            tableDims?.od !== undefined
              ? `empty: ${tableDims.od} from the NPS`
              : 'empty: from the NPS'
          }
          inputMode="decimal"
          autoComplete="off"
          disabled={readOnly}
          error={msg('outsideDiameter')}
          {...register('outsideDiameter', { setValueAs: parseNumberInput })}
        />
        <TextField
          label="Nominal wall T"
          unit={units.label('length')}
          hint={
            tableDims?.wall !== undefined
              ? `empty: ${tableDims.wall} from the schedule`
              : 'empty: from the schedule'
          }
          inputMode="decimal"
          autoComplete="off"
          disabled={readOnly}
          error={msg('nominalWall')}
          {...register('nominalWall', { setValueAs: parseNumberInput })}
        />
        <TextField
          label="Inside diameter d"
          unit={units.label('length')}
          hint="given: straights use the ID form, Eq. (3b)"
          inputMode="decimal"
          autoComplete="off"
          disabled={readOnly}
          error={msg('insideDiameter')}
          {...register('insideDiameter', { setValueAs: parseNumberInput })}
        />
        <div />
        {element.kind === 'straight' ? (
          <>
            <TextField
              label="Length"
              unit={units.label('length')}
              hint="cut length: the leg less the bend tangents"
              inputMode="decimal"
              autoComplete="off"
              disabled={readOnly}
              error={msg('length')}
              {...register('length', { setValueAs: parseNumberInput })}
            />
            <SelectField
              label="End type"
              disabled={readOnly}
              options={opt(END_TYPES, 'plain (default)')}
              error={msg('endType')}
              {...register('endType', { setValueAs: parseTextInput })}
            />
          </>
        ) : (
          <>
            <TextField
              label="Bend angle"
              unit="°"
              hint="the leg after the bend turns in the bend's plane"
              inputMode="decimal"
              autoComplete="off"
              disabled={readOnly}
              error={msg('angle')}
              {...register('angle', { setValueAs: parseNumberInput })}
            />
            <div />
            <SelectField
              label="Bend radius given as"
              disabled={readOnly}
              options={[
                { value: 'multipleOfD', label: 'multiple of D' },
                { value: 'length', label: 'length' },
              ]}
              error={msg('radiusMode')}
              {...register('radiusMode')}
            />
            <TextField
              label="Bend radius"
              unit={radiusMode === 'multipleOfD' ? '× D' : units.label('length')}
              inputMode="decimal"
              autoComplete="off"
              disabled={readOnly}
              error={msg('radiusValue')}
              {...register('radiusValue', { setValueAs: parseNumberInput })}
            />
          </>
        )}
        <SelectField
          label="Direction"
          disabled={readOnly}
          options={opt(DIRECTIONS, element.heading ? '(angled, as drawn)' : '(not set)')}
          hint={
            element.heading
              ? `angled: ${describeDirection(headingToVec(element.heading))}`
              : undefined
          }
          error={msg('direction')}
          {...register('direction', { setValueAs: parseTextInput })}
        />
        <TextField
          label="Tag"
          autoComplete="off"
          disabled={readOnly}
          error={msg('tag')}
          {...register('tag', { setValueAs: parseTextInput })}
        />
      </div>
      {readOnly ? null : (
        <div className="flex gap-2">
          <Button type="submit" variant="primary" size="sm" disabled={!formState.isDirty}>
            Apply
          </Button>
          <Button
            size="sm"
            variant="ghost"
            disabled={!formState.isDirty}
            onClick={() => reset(defaults)}
          >
            Discard
          </Button>
        </div>
      )}
    </form>
  );
}
