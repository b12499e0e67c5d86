import { useEffect, useRef, useState } from 'react';
import { useBlocker, useParams, useSearchParams } from 'react-router-dom';
import { findTransition, TRANSITIONS, type SpoolStatus } from '@shared/model/permissions';
import { parseSpoolDocument, type Conditions, type FieldIssue, type SpoolDocument, type UnitSystem } from '@shared/model/spool';
import { Button } from '@/components/ui/button';
import { CautionNote } from '@/components/ui/caution-note';
import { CheckBadge, LifecycleBadge } from '@/components/ui/status-badge';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { useRole } from '@/features/auth/use-can';
import { useSpool } from '@/features/spools/api/get-spool';
import { readConflict, useUpdateSpool } from '@/features/spools/api/update-spool';
import { useTransitionSpool } from '@/features/spools/api/transition-spool';
import type { Spool } from '@/features/spools/api/spool-schemas';
import { useQueryClient } from '@tanstack/react-query';
import { spoolKeys } from '@/features/spools/api/spool-schemas';
import { can } from '@shared/model/permissions';
import { inputClass } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import { createSpoolStore, type SpoolStore } from './store/spool-store';
import { SpoolStoreProvider, useSpoolCheck, useSpoolStore, useSpoolStoreApi } from './store/spool-store-context';
import { CanvasSlot } from './components/canvas-slot';
import { ConflictPanel } from './components/conflict-panel';
import { ConditionsForm } from './components/conditions-form';
import { DisplayUnitsProvider, readStoredDisplayUnits, storeDisplayUnits } from './components/display-units';
import { DrawingBar } from './components/drawing-bar';
import { ElementInspector } from './components/element-inspector';
import { ElementTable } from './components/element-table';
import { UnitsSwitch } from './components/units-switch';

const TRANSITION_LABELS: Record<string, string> = {
  'draft>submitted': 'Submit for check',
  'submitted>checked': 'Mark checked',
  'submitted>draft': 'Return to designer',
  'checked>released': 'Release for fabrication',
};

function downloadJson(filename: string, data: unknown) {
  const blob = new Blob([`${JSON.stringify(data, null, 2)}\n`], { type: 'application/json' });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

const fileNameOf = (doc: SpoolDocument) => `${(doc.name || 'spool').replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'spool'}.spool.json`;

/** A text box that edits a document field on blur / Enter and follows the document otherwise. */
function MetaInput({
  label,
  value,
  onCommit,
  disabled,
  className,
  placeholder,
}: {
  label: string;
  value: string;
  onCommit: (v: string) => void;
  disabled: boolean;
  className: string;
  placeholder?: string;
}) {
  const [text, setText] = useState(value);
  const [focused, setFocused] = useState(false);
  useEffect(() => {
    if (!focused) setText(value);
  }, [value, focused]);
  return (
    <input
      aria-label={label}
      placeholder={placeholder}
      className={cn(inputClass, className)}
      value={text}
      disabled={disabled}
      onChange={(e) => setText(e.target.value)}
      onFocus={() => setFocused(true)}
      onBlur={() => {
        setFocused(false);
        if (text !== value) onCommit(text);
      }}
      onKeyDown={(e) => {
        if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
      }}
    />
  );
}

/** The header of the sketcher: name, line, state, save, import/export, lifecycle, units. */
function SpoolBar({
  spool,
  canEdit,
  displayUnits,
  onDisplayUnits,
  onSave,
  saving,
  onImportIssues,
}: {
  spool: Spool;
  canEdit: boolean;
  displayUnits: UnitSystem;
  onDisplayUnits: (u: UnitSystem) => void;
  onSave: () => void;
  saving: boolean;
  onImportIssues: (issues: FieldIssue[] | null) => void;
}) {
  const api = useSpoolStoreApi();
  const doc = useSpoolStore((s) => s.doc);
  const isDirty = useSpoolStore((s) => s.isDirty);
  const check = useSpoolCheck();
  const role = useRole();
  const transition = useTransitionSpool();
  const fileRef = useRef<HTMLInputElement>(null);
  const moves = TRANSITIONS.filter((t) => t.from === spool.status && can(role, t.action));

  const runTransition = (to: SpoolStatus) => {
    if (!findTransition(spool.status, to)) return;
    let note: string | undefined;
    if (spool.status === 'submitted' && to === 'draft') {
      const n = window.prompt('Why is it returned? (the note goes to the designer)');
      if (n === null) return;
      note = n;
    }
    transition.mutate(
      { id: spool.id, to, note },
      {
        onSuccess: (next) => {
          const s = api.getState();
          s.markSaved(next.version, s.savedDoc);
        },
      },
    );
  };

  const onImport = async (file: File) => {
    let json: unknown;
    try {
      json = JSON.parse(await file.text());
    } catch {
      onImportIssues([{ path: '(file)', message: 'is not valid JSON' }]);
      return;
    }
    const r = parseSpoolDocument(json);
    if (!r.ok) {
      onImportIssues(r.issues);
      return;
    }
    onImportIssues(null);
    // Replace the sketch but keep the saved reference, so the import counts as an unsaved change.
    const s = api.getState();
    const savedDoc = s.savedDoc;
    const version = s.savedVersion ?? spool.version;
    s.load(r.doc, version);
    s.markSaved(version, savedDoc);
  };

  return (
    <div className="flex flex-wrap items-center gap-3 border-b border-steel-200 bg-steel-50 px-3 py-2">
      <MetaInput label="Spool name" value={doc.name ?? ''} disabled={!canEdit} className="w-48 font-semibold" onCommit={(name) => api.getState().setMeta({ name })} />
      <MetaInput label="Line number" placeholder="line number" value={doc.line ?? ''} disabled={!canEdit} className="w-32" onCommit={(line) => api.getState().setMeta({ line })} />
      <LifecycleBadge status={spool.status} />
      <span className="text-xs text-steel-500" data-testid="revision">
        rev. {spool.revision} · v{spool.version}
      </span>
      <span className="flex items-center gap-1 text-xs" data-testid="check-summary">
        <CheckBadge status={check.worst} />
        <span className="text-steel-500">
          {check.summary.pass} pass · {check.summary.marginal} marginal · {check.summary.fail} fail
          {check.summary.review > 0 ? ` · ${check.summary.review} review` : ''}
          {check.summary.invalid > 0 ? ` · ${check.summary.invalid} invalid` : ''}
        </span>
      </span>
      <div className="ml-auto flex flex-wrap items-center gap-2">
        <UnitsSwitch value={displayUnits} docUnits={doc.units} onChange={onDisplayUnits} />
        <Button size="sm" onClick={() => downloadJson(fileNameOf(doc), doc)} title="Download the spool document (JSON)">
          Export
        </Button>
        {canEdit ? (
          <>
            <Button size="sm" onClick={() => fileRef.current?.click()} title="Replace the sketch with a spool document (JSON)">
              Import
            </Button>
            <input
              ref={fileRef}
              type="file"
              accept="application/json,.json"
              aria-label="Import spool document"
              className="hidden"
              data-testid="import-input"
              onChange={(e) => {
                const f = e.target.files?.[0];
                e.target.value = '';
                if (f) void onImport(f);
              }}
            />
          </>
        ) : null}
        {moves.map((t) => {
          // The server refuses to release a spool with failing or uncheckable elements; say so up front.
          const blockedByCheck = t.to === 'released' && check.summary.fail + check.summary.invalid > 0;
          return (
            <Button
              key={t.to}
              size="sm"
              disabled={isDirty || transition.isPending || blockedByCheck}
              title={isDirty ? 'Save first' : blockedByCheck ? 'Every element must pass (or be marginal/reviewed) before release' : undefined}
              data-blocked={blockedByCheck ? 'check' : undefined}
              onClick={() => runTransition(t.to)}
            >
              {TRANSITION_LABELS[`${t.from}>${t.to}`] ?? t.to}
            </Button>
          );
        })}
        {canEdit ? (
          <Button size="sm" variant="primary" onClick={onSave} disabled={!isDirty || saving} title="Save (Ctrl+S)">
            {saving ? 'Saving…' : isDirty ? 'Save' : 'Saved'}
          </Button>
        ) : null}
        {isDirty ? (
          <span className="text-xs font-medium text-copper-600" data-testid="dirty">
            unsaved changes
          </span>
        ) : null}
      </div>
      {transition.isError ? (
        <div className="w-full">
          <ErrorLine error={transition.error} />
        </div>
      ) : null}
    </div>
  );
}

/** Spool-wide design conditions, applied as one undo step. */
function ConditionsPanel({ readOnly }: { readOnly: boolean }) {
  const api = useSpoolStoreApi();
  const conditions = useSpoolStore((s) => s.doc.conditions);
  const [refusal, setRefusal] = useState<string | null>(null);
  const apply = (next: Conditions) => {
    const patch: Record<string, unknown> = {};
    for (const k of new Set([...Object.keys(conditions), ...Object.keys(next)])) patch[k] = (next as Record<string, unknown>)[k];
    const r = api.getState().setConditions(patch as Partial<Conditions>);
    setRefusal(r.ok ? null : r.message);
  };
  return (
    <div className="flex flex-col gap-3 p-3">
      <h2 className="text-base font-semibold text-steel-800">Design conditions</h2>
      <p className="text-xs text-steel-500">Every element uses these unless it overrides a value.</p>
      {refusal ? (
        <p role="alert" className="rounded border border-red-200 bg-red-50 px-2 py-1 text-sm text-red-800">
          Not applied: {refusal}
        </p>
      ) : null}
      <ConditionsForm conditions={conditions} onApply={apply} readOnly={readOnly} />
      <CautionNote />
    </div>
  );
}

function useDocumentTitle(title: string) {
  useEffect(() => {
    const before = document.title;
    document.title = title;
    return () => {
      document.title = before;
    };
  }, [title]);
}

function LeaveGuard({ isDirty }: { isDirty: boolean }) {
  const blocker = useBlocker(({ currentLocation, nextLocation }) => isDirty && currentLocation.pathname !== nextLocation.pathname);
  useEffect(() => {
    if (!isDirty) return;
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    return () => window.removeEventListener('beforeunload', onBeforeUnload);
  }, [isDirty]);
  if (blocker.state !== 'blocked') return null;
  return (
    <div role="alertdialog" aria-label="Unsaved changes" className="fixed inset-0 z-50 flex items-center justify-center bg-steel-900/40">
      <div className="w-96 rounded-lg bg-white p-4 shadow-xl">
        <h2 className="mb-2 font-semibold text-steel-800">Leave without saving?</h2>
        <p className="mb-4 text-sm text-steel-600">This spool has changes that are not saved. They are lost if you leave.</p>
        <div className="flex justify-end gap-2">
          <Button onClick={() => blocker.reset()}>Stay</Button>
          <Button variant="danger" onClick={() => blocker.proceed()}>
            Leave and drop changes
          </Button>
        </div>
      </div>
    </div>
  );
}

function SketchScreen({ spool }: { spool: Spool }) {
  const api = useSpoolStoreApi();
  const qc = useQueryClient();
  const role = useRole();
  const canEdit = can(role, 'spool:edit');
  const doc = useSpoolStore((s) => s.doc);
  const isDirty = useSpoolStore((s) => s.isDirty);
  const selectedId = useSpoolStore((s) => s.selectedId);
  const check = useSpoolCheck();
  const [displayUnits, setDisplayUnits] = useState<UnitSystem>(() => readStoredDisplayUnits() ?? spool.document.units);
  const [tab, setTab] = useState<'element' | 'conditions'>('element');
  const [conflict, setConflict] = useState<{ mine: SpoolDocument; current: Spool } | null>(null);
  const [importIssues, setImportIssues] = useState<FieldIssue[] | null>(null);
  const update = useUpdateSpool();
  useDocumentTitle(`${doc.name || 'Spool'}${isDirty ? ' (unsaved)' : ''} · Spoolwright`);

  useEffect(() => {
    if (selectedId) setTab('element');
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
        />
        {conflict ? <ConflictPanel mine={conflict.mine} current={conflict.current} onReload={reloadTheirs} onKeepEditing={keepMine} /> : null}
        {saveError ? (
          <div className="px-3 py-1">
            <ErrorLine error={saveError} />
          </div>
        ) : null}
        {importIssues ? (
          <div role="alert" className="border-b border-red-200 bg-red-50 px-3 py-2 text-sm text-red-800">
            <strong>Not imported:</strong>
            <ul className="list-disc pl-5 font-mono text-xs">
              {importIssues.slice(0, 20).map((iss, i) => (
                <li key={i}>
                  {iss.path}: {iss.message}
                </li>
              ))}
            </ul>
            <button type="button" className="text-xs underline" onClick={() => setImportIssues(null)}>
              dismiss
            </button>
          </div>
        ) : null}
        <DrawingBar canEdit={canEdit} onSave={save} onFit={() => api.getState().requestFit()} />
        <div className="flex min-h-0 flex-1">
          <div className="flex min-w-0 flex-1 flex-col">
            <div className="relative min-h-0 flex-1">
              <CanvasSlot />
            </div>
            <CautionNote className="shrink-0 rounded-none border-t border-steel-200" />
            <div className="h-56 shrink-0 border-t border-steel-200 bg-white">
              <ElementTable elements={doc.elements} checks={check.elements} selectedId={selectedId} onSelect={(id) => api.getState().select(id)} />
            </div>
          </div>
          <aside className="flex w-[26rem] shrink-0 flex-col border-l border-steel-200 bg-white" aria-label="Inspector">
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
                  className={cn('flex-1 px-3 py-2', tab === id ? 'border-b-2 border-copper-500 font-semibold text-steel-900' : 'text-steel-500 hover:text-steel-800')}
                >
                  {label}
                </button>
              ))}
            </div>
            <div role="tabpanel" aria-label={tab === 'element' ? 'Selected element' : 'Design conditions'} className="min-h-0 flex-1 overflow-auto">{tab === 'element' ? <ElementInspector readOnly={!canEdit} /> : <ConditionsPanel readOnly={!canEdit} />}</div>
          </aside>
        </div>
      </div>
    </DisplayUnitsProvider>
  );
}

function SketchWorkspace({ initial, selectId }: { initial: Spool; selectId: string | null }) {
  const [store] = useState<SpoolStore>(() => {
    const s = createSpoolStore(initial.document);
    s.getState().load(initial.document, initial.version);
    // `?element=B1` (e.g. from the register's weakest-element link) opens with it selected.
    if (selectId && initial.document.elements.some((e) => e.id === selectId)) s.getState().select(selectId);
    return s;
  });
  // Status, revision and version follow the query cache (saves and transitions update it).
  const { data } = useSpool(initial.id);
  const spool = data ?? initial;
  return (
    <SpoolStoreProvider store={store}>
      <SketchScreen spool={spool} />
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
  return <SketchWorkspace key={query.data.id} initial={query.data} selectId={params.get('element')} />;
}
