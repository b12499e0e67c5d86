import { useCallback, useEffect, useState, type ReactNode } from 'react';
import type { CheckOptions, SpoolCheck } from '@shared/engine';
import type { SpoolDocument } from '@shared/model/spool';
import { CautionNote } from '@/components/ui/caution-note';
import { cn } from '@/lib/cn';
import { CanvasSlot } from '@/features/sketch/components/canvas-slot';
import { CanvasTools } from '@/features/sketch/components/canvas-tools';
import { ConditionsPanel } from '@/features/sketch/components/conditions-panel';
import { DisplayUnitsProvider } from '@/features/sketch/components/display-units';
import { ElementInspector } from '@/features/sketch/components/element-inspector';
import { ElementTable } from '@/features/sketch/components/element-table';
import { createSpoolStore, type SpoolStore } from '@/features/sketch/store/spool-store';
import {
  SpoolStoreProvider,
  useSpoolCheck,
  useSpoolStore,
  useSpoolStoreApi,
} from '@/features/sketch/store/spool-store-context';

export interface ReadOnlySketchProps {
  readonly document: SpoolDocument;
  /** A check made elsewhere (the server's for a shared link); else the document is checked here. */
  readonly check?: SpoolCheck | undefined;
  readonly checkOptions?: CheckOptions | undefined;
  /** Shown above the drawing (what this is, and the way back). */
  readonly banner: ReactNode;
  /** Element to open with. */
  readonly selectId?: string | null | undefined;
}

function ReadOnlyScreen({ banner }: { readonly banner: ReactNode }) {
  const api = useSpoolStoreApi();
  const doc = useSpoolStore((s) => s.doc);
  const selectedId = useSpoolStore((s) => s.selectedId);
  const check = useSpoolCheck();
  const [tab, setTab] = useState<'element' | 'conditions'>('element');
  const select = useCallback((id: string) => api.getState().select(id), [api]);
  useEffect(() => {
    if (selectedId) setTab('element');
  }, [selectedId]);
  return (
    <DisplayUnitsProvider doc={doc.units} display={doc.units}>
      <div className="flex h-full flex-col font-sans" data-testid="read-only-sketch">
        {banner}
        <div className="flex min-h-0 flex-1">
          <div className="flex min-w-0 flex-1 flex-col">
            <div className="relative min-h-0 flex-1">
              <CanvasSlot />
              <CanvasTools />
            </div>
            <CautionNote className="shrink-0 rounded-none border-t border-steel-200" />
            <div className="h-56 shrink-0 border-t border-steel-200 bg-white">
              <ElementTable
                elements={doc.elements}
                checks={check.elements}
                selectedId={selectedId}
                onSelect={select}
              />
            </div>
          </div>
          <aside
            className="flex w-[26rem] shrink-0 flex-col border-l border-steel-200 bg-white"
            aria-label="Inspector"
          >
            <div role="tablist" className="flex border-b border-steel-200 text-sm">
              {(
                [
                  ['element', 'Selected element'],
                  ['conditions', 'Design conditions'],
                ] as const
              ).map(([id, label]) => (
                <button
                  key={id}
                  type="button"
                  role="tab"
                  aria-selected={tab === id}
                  onClick={() => setTab(id)}
                  className={cn(
                    'flex-1 px-3 py-2',
                    tab === id
                      ? 'border-b-2 border-copper-500 font-semibold text-steel-900'
                      : 'text-steel-500 hover:text-steel-800',
                  )}
                >
                  {label}
                </button>
              ))}
            </div>
            <div
              role="tabpanel"
              aria-label={tab === 'element' ? 'Selected element' : 'Design conditions'}
              className="min-h-0 flex-1 overflow-auto"
            >
              {tab === 'element' ? <ElementInspector readOnly /> : <ConditionsPanel readOnly />}
            </div>
          </aside>
        </div>
      </div>
    </DisplayUnitsProvider>
  );
}

/**
 * A spool document shown with the sketcher's own canvas, element list and inspector, with every
 * editing control off: an older revision, or a shared link. No drawing bar, so no drawing keys.
 */
export function ReadOnlySketch({
  document,
  check,
  checkOptions,
  banner,
  selectId,
}: ReadOnlySketchProps) {
  const [store] = useState<SpoolStore>(() => {
    const s = createSpoolStore(document);
    s.getState().load(document, null);
    if (selectId && document.elements.some((e) => e.id === selectId)) s.getState().select(selectId);
    return s;
  });
  return (
    <SpoolStoreProvider store={store} check={check} checkOptions={checkOptions}>
      <ReadOnlyScreen banner={banner} />
    </SpoolStoreProvider>
  );
}
