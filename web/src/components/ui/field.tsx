import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

const control = 'w-full rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm text-ink placeholder:text-ink-muted aria-[invalid=true]:border-danger';

interface FieldShell {
  label: string;
  error?: string;
  hint?: ReactNode;
  className?: string;
}

function Shell({ id, label, error, hint, className = '', children }: FieldShell & { id: string; children: ReactNode }) {
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-medium text-ink-soft">
        {label}
      </label>
      {children}
      {hint && !error && <p id={`${id}-hint`} className="text-xs text-ink-muted">{hint}</p>}
      {error && (
        <p id={`${id}-error`} className="text-xs font-medium text-danger" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

/** A labelled text input with its error message wired to aria-describedby. */
export function TextField({ label, error, hint, className, id: given, ...props }: FieldShell & InputHTMLAttributes<HTMLInputElement>) {
  const auto = useId();
  const id = given ?? auto;
  return (
    <Shell id={id} label={label} error={error} hint={hint} className={className}>
      <input id={id} className={control} aria-invalid={!!error} aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined} {...props} />
    </Shell>
  );
}

/** A labelled select. */
export function SelectField({ label, error, hint, className, id: given, children, ...props }: FieldShell & SelectHTMLAttributes<HTMLSelectElement>) {
  const auto = useId();
  const id = given ?? auto;
  return (
    <Shell id={id} label={label} error={error} hint={hint} className={className}>
      <select id={id} className={control} aria-invalid={!!error} aria-describedby={error ? `${id}-error` : undefined} {...props}>
        {children}
      </select>
    </Shell>
  );
}

/** A labelled multi-line text area. */
export function TextAreaField({ label, error, hint, className, id: given, ...props }: FieldShell & TextareaHTMLAttributes<HTMLTextAreaElement>) {
  const auto = useId();
  const id = given ?? auto;
  return (
    <Shell id={id} label={label} error={error} hint={hint} className={className}>
      <textarea id={id} className={control} aria-invalid={!!error} aria-describedby={error ? `${id}-error` : undefined} {...props} />
    </Shell>
  );
}
