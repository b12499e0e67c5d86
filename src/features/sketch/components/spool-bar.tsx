import { useEffect, useRef, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { can, findTransition, TRANSITIONS, type SpoolStatus } from '@shared/model/permissions';
import {
  parseSpoolDocument,
  type FieldIssue,
  type SpoolDocument,
  type UnitSystem,
} from '@shared/model/spool';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { CheckBadge, LifecycleBadge } from '@/components/ui/status-badge';
import { ErrorLine } from '@/components/ui/spinner';
import { useRole } from '@/features/auth/use-can';
import { useTransitionSpool } from '@/features/spools/api/transition-spool';
import { ReturnForm } from '@/features/review/components/return-form';
import type { Spool } from '@/features/spools/api/spool-schemas';
import { cn } from '@/lib/cn';
import { useSpoolCheck, useSpoolStore, useSpoolStoreApi } from '../store/spool-store-context';
import { UnitsSwitch } from './units-switch';

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

const fileNameOf = (doc: SpoolDocument) =>
  `${(doc.name || 'spool').replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'spool'}.spool.json`;

/** A text box that edits a document field on blur / Enter and follows the document otherwise. */
function MetaInput({
  label,
  value,
  onCommit,
  disabled,
  className,
  placeholder,
  maxLength,
}: {
  label: string;
  value: string;
  onCommit: (v: string) => void;
  disabled: boolean;
  className: string;
  placeholder?: string;
  maxLength?: number;
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
      maxLength={maxLength}
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
export function SpoolBar({
  spool,
  canEdit,
  displayUnits,
  onDisplayUnits,
  onSave,
  saving,
  onImportIssues,
  actions,
}: {
  spool: Spool;
  canEdit: boolean;
  displayUnits: UnitSystem;
  onDisplayUnits: (u: UnitSystem) => void;
  onSave: () => void;
  saving: boolean;
  onImportIssues: (issues: FieldIssue[] | null) => void;
  /** More buttons for the right-hand group (e.g. Share). */
  actions?: ReactNode;
}) {
  const api = useSpoolStoreApi();
  const doc = useSpoolStore((s) => s.doc);
  const isDirty = useSpoolStore((s) => s.isDirty);
  const check = useSpoolCheck();
  const role = useRole();
  const transition = useTransitionSpool();
  const fileRef = useRef<HTMLInputElement>(null);
  const moves = TRANSITIONS.filter((t) => t.from === spool.status && can(role, t.action));

  const [returning, setReturning] = useState(false);
  const runTransition = (to: SpoolStatus, note?: string) => {
    if (!findTransition(spool.status, to)) return;
    if (spool.status === 'submitted' && to === 'draft' && note === undefined) {
      // The reason is asked for in the page (ReturnForm below), then sent with the move.
      transition.reset();
      setReturning(true);
      return;
    }
    transition.mutate(
      { id: spool.id, to, note },
      {
        onSuccess: (next) => {
          const s = api.getState();
          s.markSaved(next.version, s.savedDoc);
          setReturning(false);
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
    // One undoable edit: the saved reference stays, so the import counts as an unsaved change.
    api.getState().replaceDocument(r.doc);
  };

  return (
    <div className="flex flex-wrap items-center gap-3 border-b border-steel-200 bg-steel-50 px-3 py-2">
      <MetaInput
        label="Spool name"
        maxLength={200}
        value={doc.name ?? ''}
        disabled={!canEdit}
        className="w-48 font-semibold"
        onCommit={(name) => api.getState().setMeta({ name })}
      />
      <MetaInput
        label="Line number"
        maxLength={120}
        placeholder="line number"
        value={doc.line ?? ''}
        disabled={!canEdit}
        className="w-32"
        onCommit={(line) => api.getState().setMeta({ line })}
      />
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
        <Link
          to={`/spools/${encodeURIComponent(spool.id)}/calc-sheet`}
          className="inline-flex h-7 items-center rounded border border-steel-300 bg-white px-2 text-xs font-medium text-steel-800 hover:bg-steel-100"
          title="The calc sheet of the saved revision: print it or download the PDF"
        >
          Calc sheet
        </Link>
        <Link
          to={`/spools/${encodeURIComponent(spool.id)}/fabrication`}
          className="inline-flex h-7 items-center rounded border border-steel-300 bg-white px-2 text-xs font-medium text-steel-800 hover:bg-steel-100"
          title={
            isDirty
              ? 'The fabrication sheet shows the saved spool: save first to include your changes'
              : 'Bend list, cut list, bill of materials, masses and hydrotest'
          }
        >
          Fabrication sheet
        </Link>
        <Button
          size="sm"
          onClick={() => downloadJson(fileNameOf(doc), doc)}
          title="Download the spool document (JSON)"
        >
          Export
        </Button>
        {canEdit ? (
          <>
            <Button
              size="sm"
              onClick={() => fileRef.current?.click()}
              title="Replace the sketch with a spool document (JSON)"
            >
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
          const blockedByCheck =
            t.to === 'released' && check.summary.fail + check.summary.invalid > 0;
          return (
            <Button
              key={t.to}
              size="sm"
              disabled={isDirty || transition.isPending || blockedByCheck}
              title={
                isDirty
                  ? 'Save first'
                  : blockedByCheck
                    ? 'Every element must pass (or be marginal/reviewed) before release'
                    : undefined
              }
              data-blocked={blockedByCheck ? 'check' : undefined}
              onClick={() => runTransition(t.to)}
            >
              {TRANSITION_LABELS[`${t.from}>${t.to}`] ?? t.to}
            </Button>
          );
        })}
        {actions}
        {canEdit ? (
          <Button
            size="sm"
            variant="primary"
            onClick={onSave}
            disabled={!isDirty || saving}
            title="Save (Ctrl+S)"
          >
            {saving ? 'Saving…' : isDirty ? 'Save' : 'Saved'}
          </Button>
        ) : null}
        {isDirty ? (
          <span className="text-xs font-medium text-copper-600" data-testid="dirty">
            unsaved changes
          </span>
        ) : null}
      </div>
      {returning && spool.status === 'submitted' ? (
        <ReturnForm
          busy={transition.isPending}
          onCancel={() => setReturning(false)}
          onReturn={(note) => runTransition('draft', note)}
        />
      ) : null}
      {transition.isError ? (
        <div className="w-full">
          <ErrorLine error={transition.error} />
        </div>
      ) : null}
    </div>
  );
}
