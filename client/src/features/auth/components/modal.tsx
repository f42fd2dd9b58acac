import { useEffect, useRef, type ReactNode } from 'react';

/** A native modal dialog (focus trapped by the browser, Esc closes). */
export function Modal({ open, title, onClose, children }: { open: boolean; title: string; onClose: () => void; children: ReactNode }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      onClose={onClose}
      aria-label={title}
      className="m-auto w-[calc(100%-1.5rem)] max-w-md rounded-xl border border-line bg-card p-0 text-ink shadow-xl backdrop:bg-hull/60"
    >
      {open && (
        <div className="p-4 sm:p-6">
          <h2 className="text-xl">{title}</h2>
          <div className="mt-3">{children}</div>
        </div>
      )}
    </dialog>
  );
}
