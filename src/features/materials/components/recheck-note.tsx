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
  if (status.state === 'running') {
    return (
      <span data-testid="rechecked" data-running>
        Re-checking the team's spools… {status.total > 0 ? `${status.done} of ${status.total}` : ''}
      </span>
    );
  }
  if (status.state === 'failed')
    return (
      <span data-testid="rechecked" className="text-red-700">
        The re-check of the team's spools failed: {status.error}
      </span>
    );
  return null;
}
