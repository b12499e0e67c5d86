import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { useSpoolStore, useSpoolStoreApi } from '../store/spool-store-context';
import { KEY_HELP, useSketchKeys } from './sketch-keys';
import { ViewMenu } from './view-menu';

/** Key map popover. */
function KeyHelp({ open, onClose }: { open: boolean; onClose: () => void }) {
  if (!open) return null;
  return (
    <div
      role="dialog"
      aria-label="Sketcher keys"
      className="absolute top-full right-0 z-20 mt-1 w-96 rounded-lg border border-steel-200 bg-white p-3 shadow-lg"
    >
      <div className="mb-2 flex items-center justify-between">
        <h3 className="text-sm font-semibold text-steel-800">Keys</h3>
        <Button size="sm" variant="ghost" onClick={onClose} aria-label="Close key list">
          ✕
        </Button>
      </div>
      <table className="w-full text-xs">
        <tbody>
          {KEY_HELP.map((k) => (
            <tr key={k.keys} className="border-t border-steel-100">
              <td className="py-1 pr-2 font-mono whitespace-nowrap text-steel-800">{k.keys}</td>
              <td className="py-1 text-steel-600">{k.what}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-2 text-[11px] text-steel-500">
        Keys work while the focus is not in a text field. The leg length comes from the length box.
      </p>
    </div>
  );
}

/** Tools floating over the sketch: fit to spool (F), focus on selected (Shift+F), display settings and the key list (?). */
export function CanvasTools() {
  const api = useSpoolStoreApi();
  const [helpOpen, setHelpOpen] = useState(false);
  const fit = () => api.getState().requestFit();
  const selectedId = useSpoolStore((s) => s.selectedId);
  const focusSelected = () => {
    if (api.getState().selectedId) api.getState().requestFocus();
  };
  useSketchKeys({
    onFit: fit,
    onFocusSelected: focusSelected,
    onHelp: () => setHelpOpen((o) => !o),
    onEscape: () => setHelpOpen(false),
  });
  return (
    <div className="absolute top-2 right-2 z-10 flex items-center gap-1">
      <Button size="sm" onClick={fit} title="Fit the spool in view (F)">
        Fit
      </Button>
      <Button
        size="sm"
        onClick={focusSelected}
        disabled={!selectedId}
        title={
          selectedId
            ? `Zoom to ${selectedId} (Shift+F)`
            : 'Select an element to zoom to it (Shift+F)'
        }
      >
        Focus
      </Button>
      <ViewMenu />
      <Button
        size="sm"
        onClick={() => setHelpOpen((o) => !o)}
        aria-expanded={helpOpen}
        title="Keys (?)"
      >
        Keys ?
      </Button>
      <KeyHelp open={helpOpen} onClose={() => setHelpOpen(false)} />
    </div>
  );
}
