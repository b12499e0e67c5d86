import type { RecheckFields } from '../api/material-schemas';
import { useRecheckStatus } from '../api/use-recheck-status';

/** "N spools re-checked" after a library change (or the state of the background re-check). */
export function RecheckNote({ result }: { readonly result: RecheckFields | undefined }) {
  const status = useRecheckStatus(result);
  if (status.state === 'done') {
    return (
      <span data-testid="rechecked">
        {status.count} spool{status.count === 1 ? '' : 's'} re-checked against the updated library.
      </span>
    );
  }
  if (status.state === 'running') return <span data-testid="rechecked">Re-checking the team's spools…</span>;
  return null;
}
