import type { UnitSystem } from '@shared/model/spool';
import { UNIT_LABELS } from '@shared/units/units';
import { cn } from '@/lib/cn';

/** Imperial / metric display switch; the document keeps its own units. */
export function UnitsSwitch({
  value,
  docUnits,
  onChange,
}: {
  value: UnitSystem;
  docUnits: UnitSystem;
  onChange: (u: UnitSystem) => void;
}) {
  return (
    <div
      role="radiogroup"
      aria-label="Display units"
      className="flex overflow-hidden rounded border border-steel-300 text-xs"
      title={`Display units; * marks the stored units (${docUnits})`}
    >
      {(['imperial', 'metric'] as const).map((u) => {
        const l = UNIT_LABELS[u];
        return (
          <button
            key={u}
            type="button"
            role="radio"
            aria-checked={value === u}
            data-units={u}
            onClick={() => onChange(u)}
            className={cn(
              'px-2 py-1',
              value === u
                ? 'bg-steel-700 text-white'
                : 'bg-white text-steel-700 hover:bg-steel-100',
            )}
          >
            {l.length} · {l.pressure} · {l.temperature}
            {u === docUnits ? (
              <span className="ml-1 opacity-60" title="the document is stored in these units">
                *
              </span>
            ) : null}
          </button>
        );
      })}
    </div>
  );
}
