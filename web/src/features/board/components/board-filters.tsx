import type { BoardGear, BoardPerson } from '@midgray/shared';
import { hasFilters, NO_FILTERS, type BoardFilters } from '../board-model.ts';

const control = 'rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm text-ink';

/** Search on titles, gear, person and "mine"; says how many episodes match. */
export function BoardFilterBar({
  filters,
  onChange,
  gear,
  people,
  matching,
  total,
  busy,
}: {
  filters: BoardFilters;
  onChange: (f: BoardFilters) => void;
  gear: BoardGear[];
  people: BoardPerson[];
  matching: number;
  total: number;
  /** The board for the current filters is still on its way. */
  busy: boolean;
}) {
  return (
    <form role="search" aria-label="Filter the board" className="mb-4 flex flex-wrap items-end gap-2" onSubmit={(e) => e.preventDefault()}>
      <label className="flex min-w-[12rem] flex-1 flex-col gap-1 text-xs font-medium text-ink-soft sm:max-w-xs">
        Search titles
        <input type="search" className={control} value={filters.search} placeholder="e.g. K9 noise" onChange={(e) => onChange({ ...filters, search: e.target.value })} />
      </label>
      <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
        Gear
        <select className={`${control} max-w-[14rem]`} value={filters.gearId} onChange={(e) => onChange({ ...filters, gearId: e.target.value })}>
          <option value="">All gear</option>
          {gear.map((g) => (
            <option key={g.id} value={g.id}>
              {g.name}
              {g.archived ? ' (archived)' : ''}
            </option>
          ))}
        </select>
      </label>
      <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
        Person
        <select className={`${control} max-w-[12rem]`} value={filters.personId} onChange={(e) => onChange({ ...filters, personId: e.target.value })}>
          <option value="">Everyone</option>
          {people.map((p) => (
            <option key={p.userId} value={p.userId}>
              {p.name}
            </option>
          ))}
        </select>
      </label>
      <label className="flex items-center gap-2 self-end rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm">
        <input type="checkbox" checked={filters.mine} onChange={(e) => onChange({ ...filters, mine: e.target.checked })} />
        Mine
      </label>
      {hasFilters(filters) && (
        <button type="button" className="self-end rounded-md px-2.5 py-1.5 text-sm font-semibold text-accent-strong hover:bg-accent-soft" onClick={() => onChange(NO_FILTERS)}>
          Clear filters
        </button>
      )}
      <p className="self-end py-1.5 text-xs text-ink-muted sm:ml-auto" aria-live="polite" aria-busy={busy}>
        {busy ? 'Filtering…' : matching === total ? `${total} episodes` : `${matching} of ${total} episodes match`}
      </p>
    </form>
  );
}
