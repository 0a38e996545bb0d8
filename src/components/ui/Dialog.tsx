import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button } from './Button.js';

/**
 * A modal on the native <dialog> element: the browser traps focus, closes on Escape and restores
 * focus to the opener, so we do not re-implement any of that.
 */
export function Dialog({
  open,
  onClose,
  title,
  children,
  footer,
  width = 'w-[26rem]',
}: {
  open: boolean;
  onClose: () => void;
  title: string;
  children: ReactNode;
  footer: ReactNode;
  /** A Tailwind width class, for dialogs that hold a list or a table. */
  width?: string;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  // Unique per dialog: two can be open at once (a conflict arriving while another dialog is up).
  const titleId = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      onClose={onClose}
      aria-labelledby={titleId}
      className={`m-auto ${width} max-w-[calc(100vw-2rem)] rounded-panel border border-line bg-surface p-0 text-ink shadow-xl`}
    >
      {open && (
        <div className="flex flex-col">
          <h2 id={titleId} className="border-b border-line px-4 py-2.5 text-title font-semibold">
            {title}
          </h2>
          <div className="px-4 py-3 text-ui text-ink-2">{children}</div>
          <div className="flex justify-end gap-2 border-t border-line bg-raised px-4 py-2.5">{footer}</div>
        </div>
      )}
    </dialog>
  );
}

/** "Are you sure?" for destructive actions; the destructive button names the action. */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  busy,
  error,
  onConfirm,
  onCancel,
}: {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  busy?: boolean;
  error?: string;
  onConfirm: () => void;
  onCancel: () => void;
}) {
  return (
    <Dialog
      open={open}
      onClose={onCancel}
      title={title}
      footer={
        <>
          <Button onClick={onCancel} autoFocus>
            Cancel
          </Button>
          <Button variant="danger" busy={busy} onClick={onConfirm}>
            {confirmLabel}
          </Button>
        </>
      }
    >
      {children}
      {error && (
        <p role="alert" className="mt-2 text-danger">
          {error}
        </p>
      )}
    </Dialog>
  );
}
