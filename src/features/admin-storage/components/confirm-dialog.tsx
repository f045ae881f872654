import { useEffect, useRef, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';

export interface ConfirmDialogProps {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  isBusy?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

/** A modal question before an action that cannot be undone; Escape or "Keep everything" cancels. */
export function ConfirmDialog({ open, title, children, confirmLabel, isBusy = false, onConfirm, onCancel }: ConfirmDialogProps) {
  const dialogRef = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = dialogRef.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);

  return (
    <dialog
      ref={dialogRef}
      onClose={onCancel}
      aria-label={title}
      className="m-auto w-[min(92vw,34rem)] rounded-sheet border border-rule-strong bg-sheet p-0 text-ink shadow-sheet backdrop:bg-ink/50"
    >
      {open ? (
        <div className="space-y-4 p-5">
          <h2 className="text-title">{title}</h2>
          <div className="space-y-2 text-body text-ink-soft">{children}</div>
          <div className="flex justify-end gap-2 border-t border-rule pt-4">
            <Button variant="secondary" onClick={onCancel} disabled={isBusy}>
              Keep everything
            </Button>
            <Button variant="primary" onClick={onConfirm} isBusy={isBusy}>
              {confirmLabel}
            </Button>
          </div>
        </div>
      ) : null}
    </dialog>
  );
}
