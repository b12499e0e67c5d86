import { useCallback, useEffect, useMemo, useState } from 'react';
import { useParams, useSearchParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { createMaterialLookup } from '@shared/data/materials';
import { can } from '@shared/model/permissions';
import type { FieldIssue, SpoolDocument, UnitSystem } from '@shared/model/spool';
import { CautionNote } from '@/components/ui/caution-note';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { useRole } from '@/features/auth/use-can';
import { useSpool } from '@/features/spools/api/get-spool';
import { spoolKeys, type Spool } from '@/features/spools/api/spool-schemas';
import { readConflict, useUpdateSpool } from '@/features/spools/api/update-spool';
import { cn } from '@/lib/cn';
import { useMaterials } from './api/get-materials';
import { createSpoolStore, type SpoolStore } from './store/spool-store';
import {
  SpoolStoreProvider,
  useSpoolCheck,
  useSpoolStore,
  useSpoolStoreApi,
} from './store/spool-store-context';
import { CanvasSlot } from './components/canvas-slot';
import { CanvasTools } from './components/canvas-tools';
import { ConditionsPanel } from './components/conditions-panel';
import { ConflictPanel } from './components/conflict-panel';
import {
  DisplayUnitsProvider,
  readStoredDisplayUnits,
  storeDisplayUnits,
} from './components/display-units';
import { DrawingBar } from './components/drawing-bar';
import { ElementInspector } from './components/element-inspector';
import { ElementTable } from './components/element-table';
import { LeaveGuard, useDocumentTitle } from './components/leave-guard';
import { MaterialChoicesProvider, toMaterialChoices } from './components/material-choices';
import { SpoolBar } from './components/spool-bar';
import { CommentBadgesProvider } from './canvas/comment-badges-context';
import { Button } from '@/components/ui/button';
import { useComments } from '@/features/review/api/get-comments';
import { HistoryPanel } from '@/features/review/components/history-panel';
import { countOpenByElement, ReviewPanel } from '@/features/review/components/review-panel';
import { ShareDialog } from '@/features/share/components/share-dialog';
import type { CheckOptions } from '@shared/engine';

type InspectorTab = 'element' | 'conditions' | 'review' | 'history';

function SketchScreen({
  spool,
  initialTab,
  checkOptions,
}: {
  spool: Spool;
  initialTab: InspectorTab;
  checkOptions: CheckOptions | undefined;
}) {
  const api = useSpoolStoreApi();
  const qc = useQueryClient();
  const role = useRole();
  const canEdit = can(role, 'spool:edit');
  const canComment = can(role, 'spool:comment');
  const canShare = can(role, 'share:manage');
  const [sharing, setSharing] = useState(false);
  const comments = useComments(spool.id);
  const openByElement = useMemo(() => countOpenByElement(comments.data ?? []), [comments.data]);
  const openCount = useMemo(
    () => (comments.data ?? []).filter((c) => c.resolvedAt === null).length,
    [comments.data],
  );
  const doc = useSpoolStore((s) => s.doc);
  const isDirty = useSpoolStore((s) => s.isDirty);
  const selectedId = useSpoolStore((s) => s.selectedId);
  const check = useSpoolCheck();
  const [displayUnits, setDisplayUnits] = useState<UnitSystem>(
    () => readStoredDisplayUnits() ?? spool.document.units,
  );
  const [tab, setTab] = useState<InspectorTab>(initialTab);
  // Stable, so the element list keeps its columns between renders.
  const selectElement = useCallback((id: string) => api.getState().select(id), [api]);
  const openThread = useCallback(
    (id: string) => {
      api.getState().select(id);
      setTab('review');
    },
    [api],
  );
  const [conflict, setConflict] = useState<{ mine: SpoolDocument; current: Spool } | null>(null);
  const [importIssues, setImportIssues] = useState<FieldIssue[] | null>(null);
  const update = useUpdateSpool();
  useDocumentTitle(`${doc.name || 'Spool'}${isDirty ? ' (unsaved)' : ''} · Spoolwright`);

  useEffect(() => {
    // Selecting shows the element, except while reading its review thread.
    if (selectedId) setTab((t) => (t === 'conditions' ? 'element' : t));
  }, [selectedId]);

  const save = () => {
    const s = api.getState();
    if (!canEdit || !s.isDirty || update.isPending) return;
    const sent = s.doc;
    update.mutate(
      { id: spool.id, document: sent, baseVersion: s.savedVersion ?? spool.version },
      {
        onSuccess: (saved) => {
          api.getState().markSaved(saved.version, sent);
          setConflict(null);
        },
        onError: (err) => {
          const current = readConflict(err);
          if (current) setConflict({ mine: sent, current });
        },
      },
    );
  };

  const reloadTheirs = () => {
    if (!conflict) return;
    api.getState().load(conflict.current.document, conflict.current.version);
    qc.setQueryData(spoolKeys.detail(spool.id), conflict.current);
    setConflict(null);
    update.reset();
  };
  const keepMine = () => {
    if (!conflict) return;
    // The server's version becomes the base: my sketch stays dirty and the next save replaces it.
    api.getState().markSaved(conflict.current.version, conflict.current.document);
    qc.setQueryData(spoolKeys.detail(spool.id), conflict.current);
    setConflict(null);
    update.reset();
  };

  const saveError = update.isError && !readConflict(update.error) ? update.error : null;

  return (
    <DisplayUnitsProvider doc={doc.units} display={displayUnits}>
      <LeaveGuard isDirty={isDirty && canEdit} />
      <div className="flex h-full flex-col font-sans" data-testid="sketcher">
        <SpoolBar
          spool={spool}
          canEdit={canEdit}
          displayUnits={displayUnits}
          onDisplayUnits={(u) => {
            setDisplayUnits(u);
            storeDisplayUnits(u);
          }}
          onSave={save}
          saving={update.isPending}
          onImportIssues={setImportIssues}
          actions={
            canShare ? (
              <Button
                size="sm"
                onClick={() => setSharing(true)}
                title="Read-only links for people without an account"
              >
                Share…
              </Button>
            ) : null
          }
        />
        {sharing ? (
          <ShareDialog
            spoolId={spool.id}
            spoolName={spool.name || doc.name || 'spool'}
            currentRevision={spool.revision}
            onClose={() => setSharing(false)}
          />
        ) : null}
        {conflict ? (
          <ConflictPanel
            mine={conflict.mine}
            current={conflict.current}
            onReload={reloadTheirs}
            onKeepEditing={keepMine}
          />
        ) : null}
        {saveError ? (
          <div className="px-3 py-1">
            <ErrorLine error={saveError} />
          </div>
        ) : null}
        {importIssues ? (
          <div
            role="alert"
            className="border-b border-red-200 bg-red-50 px-3 py-2 text-sm text-red-800"
          >
            <strong>Not imported:</strong>
            <ul className="list-disc pl-5 font-mono text-xs">
              {importIssues.slice(0, 20).map((iss, i) => (
                <li key={i}>
                  {iss.path}: {iss.message}
                </li>
              ))}
            </ul>
            <button
              type="button"
              className="text-xs underline"
              onClick={() => setImportIssues(null)}
            >
              dismiss
            </button>
          </div>
        ) : null}
        <DrawingBar canEdit={canEdit} onSave={save} />
        <div className="flex min-h-0 flex-1">
          <div className="flex min-w-0 flex-1 flex-col">
            <div className="relative min-h-0 flex-1">
              <CommentBadgesProvider counts={openByElement} onOpen={openThread}>
                <CanvasSlot />
              </CommentBadgesProvider>
              <CanvasTools />
            </div>
            <CautionNote className="shrink-0 rounded-none border-t border-steel-200" />
            <div className="h-56 shrink-0 border-t border-steel-200 bg-white">
              <ElementTable
                elements={doc.elements}
                checks={check.elements}
                selectedId={selectedId}
                onSelect={selectElement}
                markers={openByElement}
                onMarker={openThread}
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
                  ['review', openCount > 0 ? `Review (${openCount})` : 'Review'],
                  ['history', 'History'],
                ] as const
              ).map(([id, label]) => (
                <button
                  key={id}
                  type="button"
                  role="tab"
                  aria-selected={tab === id}
                  onClick={() => setTab(id)}
                  className={cn(
                    'flex-1 px-1.5 py-2 text-[13px]',
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
              aria-label={TAB_LABELS[tab]}
              className="min-h-0 flex-1 overflow-auto"
            >
              {tab === 'element' ? <ElementInspector readOnly={!canEdit} /> : null}
              {tab === 'conditions' ? <ConditionsPanel readOnly={!canEdit} /> : null}
              {tab === 'review' ? (
                <ReviewPanel
                  spoolId={spool.id}
                  revision={spool.revision}
                  elementIds={doc.elements.map((e) => e.id)}
                  selectedId={selectedId}
                  onSelectElement={(id) => api.getState().select(id)}
                  canComment={canComment}
                />
              ) : null}
              {tab === 'history' ? (
                <HistoryPanel spoolId={spool.id} checkOptions={checkOptions} />
              ) : null}
            </div>
          </aside>
        </div>
      </div>
    </DisplayUnitsProvider>
  );
}

const TAB_LABELS: Record<InspectorTab, string> = {
  element: 'Selected element',
  conditions: 'Design conditions',
  review: 'Review',
  history: 'History',
};

function SketchWorkspace({
  initial,
  selectId,
  initialTab,
}: {
  initial: Spool;
  selectId: string | null;
  initialTab: InspectorTab;
}) {
  const [store] = useState<SpoolStore>(() => {
    const s = createSpoolStore(initial.document);
    s.getState().load(initial.document, initial.version);
    // `?element=B1` (e.g. from the register's weakest-element link) opens with it selected.
    if (selectId && initial.document.elements.some((e) => e.id === selectId))
      s.getState().select(selectId);
    return s;
  });
  // Status, revision and version follow the query cache (saves and transitions update it).
  const { data } = useSpool(initial.id);
  const spool = data ?? initial;
  // The team's own materials join the picker and the check (the server checks with them too).
  const materials = useMaterials();
  const choices = useMemo(
    () => (materials.data ? toMaterialChoices(materials.data) : undefined),
    [materials.data],
  );
  const checkOptions = useMemo(() => {
    const team = materials.data?.filter((m) => m.origin === 'team') ?? [];
    return team.length > 0 ? { findMaterial: createMaterialLookup(team) } : undefined;
  }, [materials.data]);
  return (
    <SpoolStoreProvider store={store} checkOptions={checkOptions}>
      <MaterialChoicesProvider choices={choices}>
        <SketchScreen spool={spool} initialTab={initialTab} checkOptions={checkOptions} />
      </MaterialChoicesProvider>
    </SpoolStoreProvider>
  );
}

/** The sketcher screen: drawing bar, canvas, element list and inspector for one spool. */
export function SketchPage() {
  const { spoolId = '' } = useParams();
  const [params] = useSearchParams();
  const query = useSpool(spoolId);
  if (query.isPending) return <LoadingLine label="Opening the spool…" />;
  if (query.isError)
    return (
      <div className="p-6">
        <ErrorLine error={query.error} />
      </div>
    );
  // `?panel=review` (from the waiting list) opens the review thread beside the inspector.
  const panel = params.get('panel');
  const initialTab: InspectorTab = panel === 'review' || panel === 'history' ? panel : 'element';
  return (
    <SketchWorkspace
      key={query.data.id}
      initial={query.data}
      selectId={params.get('element')}
      initialTab={initialTab}
    />
  );
}
