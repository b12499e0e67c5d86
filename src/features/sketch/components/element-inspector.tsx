import { useEffect, useMemo, useState } from 'react';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import {
  conditionOverridesSchema,
  type ConditionOverrides,
  type SpoolElement,
} from '@shared/model/spool';
import { Button } from '@/components/ui/button';
import { CautionNote } from '@/components/ui/caution-note';
import { useSpoolCheck, useSpoolStore, useSpoolStoreApi } from '../store/spool-store-context';
import type { ElementPatch } from '../store/spool-store';
import { CheckReport } from './check-report';
import { useDisplayUnitCheck } from './display-check';
import { conditionsToForm, formToConditions, type ConditionFormValues } from './condition-fields';
import { ConditionInputs } from './conditions-form';
import { useDisplayUnits } from './display-units';
import { ElementForm } from './element-form';

/** Per-element overrides of the spool conditions; empty fields inherit. */
export function OverridesForm({
  element,
  inherited,
  onApply,
  readOnly,
}: {
  element: SpoolElement;
  inherited: ConditionOverrides;
  onApply: (patch: Partial<ConditionOverrides> | null) => void;
  readOnly?: boolean;
}) {
  const units = useDisplayUnits();
  const defaults = useMemo(
    () => conditionsToForm(element.conditions, units),
    [element.conditions, units],
  );
  const form = useForm<ConditionFormValues>({
    resolver: zodResolver(
      conditionOverridesSchema as unknown as z.ZodType<ConditionFormValues, ConditionFormValues>,
    ),
    mode: 'onChange',
    defaultValues: defaults,
  });
  const { reset } = form;
  useEffect(() => {
    reset(defaults);
  }, [defaults, reset]);
  const submit = form.handleSubmit((values) => {
    const dirty = form.formState.dirtyFields as Record<string, unknown>;
    const next = formToConditions(values, element.conditions, (n) => Boolean(dirty[n]), units);
    const keys = new Set([...Object.keys(element.conditions ?? {}), ...Object.keys(next)]);
    const patch: Record<string, unknown> = {};
    for (const k of keys) patch[k] = (next as Record<string, unknown>)[k];
    onApply(Object.keys(next).length === 0 ? null : (patch as Partial<ConditionOverrides>));
  });
  const count = Object.keys(element.conditions ?? {}).length;
  return (
    <form
      aria-label="Element overrides"
      noValidate
      onSubmit={(e) => void submit(e)}
      className="flex flex-col gap-2"
    >
      <ConditionInputs
        register={form.register}
        errors={form.formState.errors}
        disabled={readOnly}
        inherited={inherited}
        currentMaterial={element.conditions?.material}
      />
      {readOnly ? null : (
        <div className="flex gap-2">
          <Button type="submit" size="sm" variant="primary" disabled={!form.formState.isDirty}>
            Apply overrides
          </Button>
          <Button size="sm" variant="ghost" disabled={count === 0} onClick={() => onApply(null)}>
            Clear all ({count})
          </Button>
        </div>
      )}
    </form>
  );
}

/** The inspector: the selected element's properties, overrides and wall check. */
export function ElementInspector({ readOnly }: { readonly readOnly?: boolean }) {
  const api = useSpoolStoreApi();
  const selectedId = useSpoolStore((s) => s.selectedId);
  const doc = useSpoolStore((s) => s.doc);
  const check = useSpoolCheck();
  const element = selectedId ? doc.elements.find((e) => e.id === selectedId) : undefined;
  const elementCheck = element ? check.elements.find((c) => c.id === element.id) : undefined;
  const trailCheck = useDisplayUnitCheck(doc, element, elementCheck);
  const [refusal, setRefusal] = useState<string | null>(null);
  useEffect(() => setRefusal(null), [selectedId]);

  const apply = (patch: ElementPatch) => {
    if (!element) return;
    const r = api.getState().updateElement(element.id, patch);
    setRefusal(r.ok ? null : r.message);
  };

  if (!element) {
    return (
      <div className="flex flex-col gap-3 p-3">
        <p className="text-sm text-steel-500">
          Select an element on the sketch or in the element list to see its properties and its wall
          check.
        </p>
        <CautionNote />
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-4 p-3" data-testid="inspector" data-element-id={element.id}>
      <header className="flex items-baseline gap-2">
        <h2 className="text-base font-semibold text-steel-800">
          {element.kind === 'bend' ? 'Bend' : 'Straight'}{' '}
          <code className="text-copper-600">{element.id}</code>
        </h2>
        {element.tag ? <span className="text-sm text-steel-500">{element.tag}</span> : null}
      </header>
      {refusal ? (
        <p
          role="alert"
          className="rounded border border-red-200 bg-red-50 px-2 py-1 text-sm text-red-800"
        >
          Not applied: {refusal}
        </p>
      ) : null}
      <ElementForm
        element={element}
        onApply={(p) => apply(p as ElementPatch)}
        readOnly={readOnly}
      />
      {elementCheck ? (
        <CheckReport
          check={elementCheck}
          schedule={element.schedule === undefined ? undefined : String(element.schedule)}
          onUseSchedule={(schedule) => apply({ schedule })}
          readOnly={readOnly}
          trailCheck={trailCheck}
        />
      ) : null}
      <details className="rounded border border-steel-200 p-2">
        <summary className="cursor-pointer text-xs font-semibold uppercase tracking-wide text-steel-600">
          Overrides of the spool conditions ({Object.keys(element.conditions ?? {}).length})
        </summary>
        <div className="mt-2">
          <OverridesForm
            element={element}
            inherited={doc.conditions}
            onApply={(c) => apply({ conditions: c })}
            readOnly={readOnly}
          />
        </div>
      </details>
      <CautionNote />
    </div>
  );
}
