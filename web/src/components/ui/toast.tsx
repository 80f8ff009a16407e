import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';

type Tone = 'info' | 'success' | 'error';
interface Toast {
  id: number;
  tone: Tone;
  title: string;
  lines?: string[];
}

const ToastContext = createContext<(t: Omit<Toast, 'id'>) => void>(() => undefined);

/** Returns `toast({ tone, title, lines })`: a message in the corner that screen readers announce. */
export const useToast = () => useContext(ToastContext);

/** Holds the toasts; errors stay until dismissed, others go after 6 s. */
export function ToastProvider({ children }: { children: ReactNode }) {
  const [toasts, setToasts] = useState<Toast[]>([]);
  const dismiss = useCallback((id: number) => setToasts((l) => l.filter((t) => t.id !== id)), []);
  const push = useCallback(
    (t: Omit<Toast, 'id'>) => {
      const id = Date.now() + Math.random();
      setToasts((l) => [...l.slice(-3), { ...t, id }]);
      if (t.tone !== 'error') setTimeout(() => dismiss(id), 6000);
    },
    [dismiss],
  );
  const value = useMemo(() => push, [push]);
  const tone: Record<Tone, string> = { info: 'border-line-strong', success: 'border-ok', error: 'border-danger' };
  return (
    <ToastContext.Provider value={value}>
      {children}
      <div className="pointer-events-none fixed right-3 bottom-3 z-50 flex w-[min(24rem,calc(100vw-1.5rem))] flex-col gap-2" aria-live="polite" role="status">
        {toasts.map((t) => (
          <div key={t.id} className={`pointer-events-auto rounded-lg border-l-4 bg-card p-3 shadow-lg ${tone[t.tone]}`} role={t.tone === 'error' ? 'alert' : undefined}>
            <div className="flex items-start justify-between gap-2">
              <p className="text-sm font-semibold">{t.title}</p>
              <button type="button" onClick={() => dismiss(t.id)} className="text-ink-muted hover:text-ink" aria-label="Dismiss message">
                ×
              </button>
            </div>
            {t.lines && t.lines.length > 0 && (
              <ul className="mt-1 list-disc pl-5 text-sm text-ink-soft">
                {t.lines.map((l) => (
                  <li key={l}>{l}</li>
                ))}
              </ul>
            )}
          </div>
        ))}
      </div>
    </ToastContext.Provider>
  );
}
