// Our confirmation dialog for destructive actions (discard, revoke, disable, delete): a modal
// <dialog> labelled by its title and described by its message, focus kept inside while it is
// open and returned to the opener afterwards, Esc or "Cancel" to back out. Extra content (e.g.
// a reason field) goes in `children`; `confirmDisabled` holds the confirm button until it is valid.
import { useCallback, useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { Button } from './button';

export interface ConfirmDialogProps {
  open: boolean;
  title: string;
  message?: ReactNode;
  children?: ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  /** danger for destructive actions (the default), primary for a weighty but safe one */
  tone?: 'danger' | 'primary';
  confirmDisabled?: boolean;
  busy?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

const FOCUSABLE = 'a[href], button:not([disabled]), input:not([disabled]), select:not([disabled]), textarea:not([disabled]), [tabindex]:not([tabindex="-1"])';

export function ConfirmDialog({ open, title, message, children, confirmLabel, cancelLabel = 'Cancel', tone = 'danger', confirmDisabled, busy, onConfirm, onCancel }: ConfirmDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const cancelRef = useRef<HTMLButtonElement>(null);
  const titleId = useId();
  const messageId = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      const opener = document.activeElement as HTMLElement | null;
      dialog.showModal();
      // the safe choice has focus first; a field inside (children) takes it when there is one
      const field = dialog.querySelector<HTMLElement>('input, textarea, select');
      (field ?? cancelRef.current)?.focus();
      return () => { if (dialog.open) dialog.close(); opener?.focus?.(); };
    }
    if (!open && dialog.open) dialog.close();
  }, [open]);

  const keepFocusInside = (event: React.KeyboardEvent<HTMLDialogElement>) => {
    if (event.key !== 'Tab') return;
    const items = [...(ref.current?.querySelectorAll<HTMLElement>(FOCUSABLE) ?? [])];
    if (items.length === 0) return;
    const first = items[0]!;
    const last = items[items.length - 1]!;
    if (event.shiftKey && document.activeElement === first) { event.preventDefault(); last.focus(); }
    else if (!event.shiftKey && document.activeElement === last) { event.preventDefault(); first.focus(); }
  };

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={message ? messageId : undefined}
      aria-modal="true"
      onCancel={(e) => { e.preventDefault(); if (!busy) onCancel(); }}
      onKeyDown={keepFocusInside}
      onClick={(e) => { if (e.target === ref.current && !busy) onCancel(); }}
      className="m-auto w-[min(28rem,calc(100vw-2rem))] rounded-lg border border-line bg-panel p-0 text-ink-900 shadow-xl backdrop:bg-ink-950/40"
    >
      {open && (
        <form method="dialog" className="p-5" onSubmit={(e) => { e.preventDefault(); if (!confirmDisabled && !busy) onConfirm(); }}>
          <h2 id={titleId} className="text-base font-semibold text-ink-950">{title}</h2>
          {message && <div id={messageId} className="mt-2 text-sm text-ink-700">{message}</div>}
          {children && <div className="mt-3">{children}</div>}
          <div className="mt-5 flex justify-end gap-2">
            <Button ref={cancelRef} onClick={onCancel} disabled={busy}>{cancelLabel}</Button>
            <Button type="submit" variant={tone} disabled={confirmDisabled || busy}>{busy ? 'Working…' : confirmLabel}</Button>
          </div>
        </form>
      )}
    </dialog>
  );
}

/**
 * A confirmation as a promise: `const [ask, dialog] = useConfirm()`, render `dialog`, then
 * `if (await ask({ title, message, confirmLabel })) …`.
 */
export function useConfirm() {
  const [request, setRequest] = useState<(Omit<ConfirmDialogProps, 'open' | 'onConfirm' | 'onCancel'> & { resolve: (ok: boolean) => void }) | null>(null);
  const ask = useCallback((options: Omit<ConfirmDialogProps, 'open' | 'onConfirm' | 'onCancel'>) => new Promise<boolean>((resolve) => setRequest({ ...options, resolve })), []);
  const finish = (ok: boolean) => { request?.resolve(ok); setRequest(null); };
  const dialog = request ? <ConfirmDialog {...request} open onConfirm={() => finish(true)} onCancel={() => finish(false)} /> : null;
  return [ask, dialog] as const;
}
