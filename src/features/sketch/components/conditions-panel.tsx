import { useState } from 'react';
import type { Conditions } from '@shared/model/spool';
import { CautionNote } from '@/components/ui/caution-note';
import { useSpoolStore, useSpoolStoreApi } from '../store/spool-store-context';
import { ConditionsForm } from './conditions-form';
import { ShopSettingsForm } from './shop-settings-form';

/** Spool-wide design conditions, applied as one undo step. */
export function ConditionsPanel({ readOnly }: { readOnly: boolean }) {
  const api = useSpoolStoreApi();
  const conditions = useSpoolStore((s) => s.doc.conditions);
  const shop = useSpoolStore((s) => s.doc.shop);
  const docUnits = useSpoolStore((s) => s.doc.units);
  const [refusal, setRefusal] = useState<string | null>(null);
  const apply = (next: Conditions) => {
    const patch: Record<string, unknown> = {};
    for (const k of new Set([...Object.keys(conditions), ...Object.keys(next)]))
      patch[k] = (next as Record<string, unknown>)[k];
    const r = api.getState().setConditions(patch as Partial<Conditions>);
    setRefusal(r.ok ? null : r.message);
  };
  return (
    <div className="flex flex-col gap-3 p-3">
      <h2 className="text-base font-semibold text-steel-800">Design conditions</h2>
      <p className="text-xs text-steel-500">
        Every element uses these unless it overrides a value.
      </p>
      {refusal ? (
        <p
          role="alert"
          className="rounded border border-red-200 bg-red-50 px-2 py-1 text-sm text-red-800"
        >
          Not applied: {refusal}
        </p>
      ) : null}
      <ConditionsForm conditions={conditions} onApply={apply} readOnly={readOnly} />
      <ShopSettingsForm
        settings={shop}
        docUnits={docUnits}
        readOnly={readOnly}
        onApply={(next) => {
          const r = api.getState().setShopSettings(next);
          return r.ok ? null : r.message;
        }}
      />
      <CautionNote />
    </div>
  );
}
