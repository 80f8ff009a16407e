/** Initials of a name, at most two letters. */
export function initialsOf(name: string) {
  const parts = name.trim().split(/\s+/).filter(Boolean);
  return ((parts[0]?.[0] ?? '?') + (parts.length > 1 ? parts[parts.length - 1][0] : '')).toUpperCase();
}

/** A round badge with a person's initials; the full name is the accessible label. */
export function Avatar({ name, size = 'md', role }: { name: string; size?: 'sm' | 'md'; role?: string }) {
  const dim = size === 'sm' ? 'h-6 w-6 text-[10px]' : 'h-8 w-8 text-xs';
  return (
    <span className={`inline-flex shrink-0 items-center justify-center rounded-full bg-ink-soft font-bold text-white ${dim}`} title={role ? `${name} (${role})` : name} aria-label={role ? `${name}, ${role}` : name} role="img">
      {initialsOf(name)}
    </span>
  );
}
