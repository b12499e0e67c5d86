import { useState } from 'react';
import { Button } from '@/components/ui/button';
import type { DimensionMode } from '../store/spool-store';
import { useSpoolStore } from '../store/spool-store-context';

const LABEL_MODES: readonly { value: DimensionMode; label: string }[] = [
  { value: 'auto', label: 'around the selection' },
  { value: 'all', label: 'on every element' },
  { value: 'none', label: 'hidden' },
];

/** Sketch display settings (not part of the spool): dimension labels and edge smoothing. */
export function ViewMenu() {
  const [open, setOpen] = useState(false);
  const view = useSpoolStore((s) => s.view);
  const setShowDimensions = useSpoolStore((s) => s.setShowDimensions);
  const setAntialias = useSpoolStore((s) => s.setAntialias);
  return (
    <div className="relative">
      <Button
        size="sm"
        onClick={() => setOpen((o) => !o)}
        aria-expanded={open}
        title="Sketch display settings"
      >
        View ▾
      </Button>
      {open ? (
        <div
          role="dialog"
          aria-label="Sketch display"
          className="absolute top-full right-0 z-20 mt-1 w-64 rounded-lg border border-steel-200 bg-white p-3 text-sm shadow-lg"
        >
          <fieldset>
            <legend className="mb-1 text-xs font-semibold text-steel-600">Dimension labels</legend>
            {LABEL_MODES.map((m) => (
              <label key={m.value} className="flex items-center gap-2 py-0.5">
                <input
                  type="radio"
                  name="label-mode"
                  checked={view.showDimensions === m.value}
                  onChange={() => setShowDimensions(m.value)}
                />
                {m.label}
              </label>
            ))}
          </fieldset>
          <label
            className="mt-2 flex items-center gap-2 border-t border-steel-100 pt-2"
            title="Antialiasing costs frame rate on software rendering"
          >
            <input
              type="checkbox"
              checked={view.antialias}
              onChange={(e) => setAntialias(e.target.checked)}
            />
            smooth edges (slower without a GPU)
          </label>
          <div className="mt-2 text-right">
            <Button size="sm" variant="ghost" onClick={() => setOpen(false)}>
              Close
            </Button>
          </div>
        </div>
      ) : null}
    </div>
  );
}
