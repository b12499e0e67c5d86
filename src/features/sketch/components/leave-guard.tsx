import { useEffect } from 'react';
import { useBlocker } from 'react-router-dom';
import { Button } from '@/components/ui/button';

/** Set the tab title while the screen is shown. */
export function useDocumentTitle(title: string) {
  useEffect(() => {
    const before = document.title;
    document.title = title;
    return () => {
      document.title = before;
    };
  }, [title]);
}

/** Asks before leaving the screen (in-app navigation or closing the tab) while there are unsaved changes. */
export function LeaveGuard({ isDirty }: { isDirty: boolean }) {
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) =>
      isDirty && currentLocation.pathname !== nextLocation.pathname,
  );
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
    <div
      role="alertdialog"
      aria-label="Unsaved changes"
      className="fixed inset-0 z-50 flex items-center justify-center bg-steel-900/40"
    >
      <div className="w-96 rounded-lg bg-white p-4 shadow-xl">
        <h2 className="mb-2 font-semibold text-steel-800">Leave without saving?</h2>
        <p className="mb-4 text-sm text-steel-600">
          This spool has changes that are not saved. They are lost if you leave.
        </p>
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
