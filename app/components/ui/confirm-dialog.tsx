import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button } from './button';

/**
 * A modal question with a confirm and a cancel button, on the browser's own <dialog> (focus is
 * kept inside it, Escape cancels). Shown while `open`; `onCancel` also runs on Escape.
 */
export function ConfirmDialog({ open, title, children, confirmLabel, pending = false, onConfirm, onCancel }: {
  open: boolean; title: string; children?: ReactNode; confirmLabel: string; pending?: boolean; onConfirm: () => void; onCancel: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog ref={ref} aria-labelledby={titleId} onCancel={(e) => { e.preventDefault(); onCancel(); }}
      className="m-auto w-[min(32rem,calc(100vw-2rem))] rounded border border-slate-400 bg-white p-0 text-slate-900 backdrop:bg-slate-900/40">
      <div className="flex flex-col gap-3 p-4">
        <h2 id={titleId} className="text-lg font-semibold">{title}</h2>
        {children ? <div className="text-slate-800">{children}</div> : null}
        <div className="flex flex-wrap justify-end gap-2">
          <Button variant="secondary" onClick={onCancel} disabled={pending}>Cancel</Button>
          <Button onClick={onConfirm} disabled={pending}>{confirmLabel}</Button>
        </div>
      </div>
    </dialog>
  );
}
