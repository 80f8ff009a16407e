import { useId } from 'react';
import { isValidTimeZone } from '@midgray/shared';
import { allTimeZones } from '../../lib/time-zones.ts';

/**
 * A time-zone field: type or pick any IANA name (the list comes from the browser), with one-click
 * choices for the zones that matter here (the channel's, the viewer's).
 */
export function ZonePicker({
  label,
  value,
  onChange,
  quick = [],
  error,
  className = '',
}: {
  label: string;
  value: string;
  onChange: (zone: string) => void;
  quick?: { label: string; zone: string }[];
  error?: string;
  className?: string;
}) {
  const id = useId();
  const listId = `${id}-zones`;
  const invalid = error ?? (value !== '' && !isValidTimeZone(value) ? 'Not a time zone: pick one from the list, e.g. Europe/Berlin' : undefined);
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-medium text-ink-soft">
        {label}
      </label>
      <input
        id={id}
        list={listId}
        value={value}
        onChange={(e) => onChange(e.target.value.trim())}
        autoComplete="off"
        spellCheck={false}
        className="w-full rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm text-ink aria-[invalid=true]:border-danger"
        aria-invalid={!!invalid}
        aria-describedby={invalid ? `${id}-error` : undefined}
      />
      <datalist id={listId}>
        {allTimeZones().map((z) => (
          <option key={z} value={z} />
        ))}
      </datalist>
      {quick.length > 0 && (
        <div className="flex flex-wrap gap-1" aria-label={`Quick choices for ${label.toLowerCase()}`}>
          {quick
            .filter((q, i, all) => all.findIndex((o) => o.zone === q.zone) === i)
            .map((q) => (
              <button
                key={q.zone}
                type="button"
                onClick={() => onChange(q.zone)}
                aria-pressed={value === q.zone}
                className={`rounded-full border px-2 py-0.5 text-xs ${value === q.zone ? 'border-ink bg-ink text-white' : 'border-line-strong bg-card text-ink-soft hover:bg-paper'}`}
              >
                {q.label === q.zone ? q.zone : `${q.label}: ${q.zone}`}
              </button>
            ))}
        </div>
      )}
      {invalid && (
        <p id={`${id}-error`} className="text-xs font-medium text-danger" role="alert">
          {invalid}
        </p>
      )}
    </div>
  );
}
