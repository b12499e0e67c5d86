import type { SpoolDocument } from '@shared/model/spool';
import { Button } from '@/components/ui/button';
import { formatDateTime } from '@/lib/format';
import type { Spool } from '@/features/spools/api/spool-schemas';
import { diffDocuments } from './document-diff';

export interface ConflictPanelProps {
  readonly mine: SpoolDocument;
  readonly current: Spool;
  /** Drop my edits and open the server's version. */
  readonly onReload: () => void;
  /** Keep my edits; the next save replaces the server's version. */
  readonly onKeepEditing: () => void;
}

/** Shown when a save was refused because someone saved the spool in the meantime. */
export function ConflictPanel({ mine, current, onReload, onKeepEditing }: ConflictPanelProps) {
  const changes = diffDocuments(mine, current.document);
  return (
    <div
      role="alertdialog"
      aria-label="Save conflict"
      className="border-b border-amber-300 bg-amber-50 px-4 py-3 text-sm text-amber-950"
      data-testid="conflict"
    >
      <p className="font-semibold">
        Not saved: this spool was saved by someone else in the meantime (version {current.version},{' '}
        {formatDateTime(current.updatedAt)}).
      </p>
      <p className="mt-1 text-amber-900">
        Your sketch differs from the saved one in{' '}
        {changes.length === 0
          ? 'nothing (same content)'
          : `${changes.length} place${changes.length === 1 ? '' : 's'}`}
        :
      </p>
      {changes.length > 0 ? (
        <ul
          className="mt-1 max-h-32 list-disc overflow-auto pl-5 font-mono text-xs"
          data-testid="conflict-changes"
        >
          {changes.map((c) => (
            <li key={`${c.target}-${c.change}`}>
              {c.target}:{' '}
              {c.change === 'added'
                ? 'only in yours'
                : c.change === 'removed'
                  ? 'only in the saved version'
                  : `differs in ${c.fields.join(', ')}`}
            </li>
          ))}
        </ul>
      ) : null}
      <div className="mt-2 flex gap-2">
        <Button size="sm" onClick={onReload}>
          Load the saved version (drop mine)
        </Button>
        <Button size="sm" variant="primary" onClick={onKeepEditing}>
          Keep editing mine (next save replaces it)
        </Button>
      </div>
    </div>
  );
}
