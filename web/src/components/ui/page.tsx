import type { ReactNode } from 'react';

/** A page's title row with optional actions on the right. */
export function PageHeader({ title, description, actions }: { title: string; description?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-5 flex flex-wrap items-end justify-between gap-3">
      <div>
        <h1 className="text-2xl font-bold">{title}</h1>
        {description && <p className="mt-1 max-w-3xl text-sm text-ink-soft">{description}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </div>
  );
}

/** A white panel with an optional heading. */
export function Panel({ title, children, className = '', actions }: { title?: string; children: ReactNode; className?: string; actions?: ReactNode }) {
  return (
    <section className={`rounded-lg border border-line bg-card p-4 ${className}`} aria-label={title}>
      {(title || actions) && (
        <div className="mb-3 flex items-center justify-between gap-2">
          {title && <h2 className="text-base font-semibold">{title}</h2>}
          {actions}
        </div>
      )}
      {children}
    </section>
  );
}

/** Shown while a query loads. */
export function Loading({ what = 'Loading' }: { what?: string }) {
  return (
    <p className="p-4 text-sm text-ink-muted" role="status">
      {what}…
    </p>
  );
}

/** Shown when a query fails; the message comes from the API. */
export function ErrorNote({ error }: { error: unknown }) {
  return (
    <p className="rounded-md border border-danger/40 bg-danger-soft p-3 text-sm text-danger" role="alert">
      {error instanceof Error ? error.message : 'Something went wrong'}
    </p>
  );
}
