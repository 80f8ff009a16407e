import { useEffect, useId, useRef, type ReactNode } from 'react';

/**
 * A modal dialog on the native <dialog> element: the browser traps focus, Escape closes it and
 * the rest of the page is inert while it is open. Children mount only while open, so forms start fresh.
 */
export function Dialog({ open, onClose, title, description, children, wide = false }: { open: boolean; onClose: () => void; title: string; description?: ReactNode; children: ReactNode; wide?: boolean }) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onClose={onClose}
      className={`m-auto max-h-[calc(100dvh-2rem)] ${wide ? 'w-[min(44rem,calc(100vw-1.5rem))]' : 'w-[min(32rem,calc(100vw-1.5rem))]'} overflow-y-auto rounded-lg border border-line bg-card p-0 text-ink shadow-xl backdrop:bg-ink/50`}
    >
      {open && (
        <div className="flex flex-col gap-4 p-5">
          <div className="flex items-start justify-between gap-3">
            <div>
              <h2 id={titleId} className="text-lg font-bold">
                {title}
              </h2>
              {description && <div className="mt-1 text-sm text-ink-soft">{description}</div>}
            </div>
            <button type="button" onClick={onClose} className="rounded-md px-2 py-1 text-lg leading-none text-ink-muted hover:bg-paper hover:text-ink" aria-label="Close">
              ×
            </button>
          </div>
          {children}
        </div>
      )}
    </dialog>
  );
}
