import { useEffect } from 'react';
import { useBlocker } from 'react-router-dom';
import { AlertTriangle } from 'lucide-react';
import { Button } from '../../../components/ui/button';

/**
 * Asks before unsaved edits are thrown away: a navigation inside the app is held by React
 * Router's useBlocker and a question is shown; closing or reloading the tab gets the browser's
 * own question through beforeunload (HTML Living Standard, "unloading documents": a handler that
 * calls preventDefault asks the user; the browser words it).
 */
export function UnsavedChangesGuard({ dirty, what = 'this layout' }: { dirty: boolean; what?: string }) {
  const blocker = useBlocker(({ currentLocation, nextLocation }) => dirty && currentLocation.pathname !== nextLocation.pathname);

  useEffect(() => {
    if (!dirty) return;
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      // Older browsers ask only when returnValue is set.
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    return () => window.removeEventListener('beforeunload', onBeforeUnload);
  }, [dirty]);

  // A save that lands while the question is up leaves nothing to lose: let the navigation go on.
  const { state } = blocker;
  useEffect(() => {
    if (state === 'blocked' && !dirty) blocker.proceed?.();
  }, [state, dirty, blocker]);

  if (blocker.state !== 'blocked') return null;
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-slate-900/40 p-4">
      <div role="alertdialog" aria-modal="true" aria-labelledby="leave-title" aria-describedby="leave-text"
        className="flex w-full max-w-md flex-col gap-3 rounded border border-slate-400 bg-white p-4"
        onKeyDown={(e) => { if (e.key === 'Escape') blocker.reset?.(); }}>
        <h2 id="leave-title" className="flex items-center gap-2 text-lg font-semibold text-warning-700">
          <AlertTriangle aria-hidden className="h-5 w-5 shrink-0" />Leave with unsaved changes?
        </h2>
        <p id="leave-text">The edits to {what} since it was last saved will be lost. Stay to keep them and save the draft.</p>
        <div className="flex flex-wrap justify-end gap-2">
          <Button autoFocus variant="primary" onClick={() => blocker.reset?.()}>Stay and keep editing</Button>
          <Button variant="danger" onClick={() => blocker.proceed?.()}>Leave and lose the edits</Button>
        </div>
      </div>
    </div>
  );
}
