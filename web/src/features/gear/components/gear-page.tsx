import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_equalsString,
  filterFn_includesString,
  globalFilteringFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_text,
  tableFeatures,
  useTable,
  type ColumnFiltersState,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { canRole, formatInstantInZone, GEAR_KIND_LABELS, GEAR_KINDS, GEAR_SOURCE_LABELS, GEAR_SOURCES, type Gear } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { ErrorNote, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { browserTimeZone } from '../../../lib/time-zones.ts';
import { useChannel } from '../../channels/current-channel.tsx';
import { useGear } from '../api/gear.ts';
import { GearDialog } from './gear-form.tsx';

// Features at module scope (stable): sorting, per-column filters (kind, source) and the search box.
const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text },
  filterFns: { includesString: filterFn_includesString, equalsString: filterFn_equalsString },
});
const helper = createColumnHelper<typeof features, Gear>();

const day = (d: string | null) => (d ? new Date(`${d}T00:00:00Z`).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }) : '—');

function EmbargoCell({ gear, viewerZone }: { gear: Gear; viewerZone: string }) {
  if (!gear.embargoAt || !gear.embargoZone) return <span className="text-ink-muted">—</span>;
  const lifted = Date.parse(gear.embargoAt) <= Date.now();
  return (
    <div className="min-w-[13rem]">
      <p>{formatInstantInZone(gear.embargoAt, gear.embargoZone)}</p>
      {viewerZone !== gear.embargoZone && <p className="text-xs text-ink-muted">Your time: {formatInstantInZone(gear.embargoAt, viewerZone)}</p>}
      {lifted && <p className="text-xs font-semibold text-ok">Lifted</p>}
    </div>
  );
}

/** The channel's gear: a sortable, filterable table; producers and admins add and edit items. */
export function GearPage() {
  const channel = useChannel();
  const [showArchived, setShowArchived] = useState(false);
  const gear = useGear(channel.id, showArchived);
  const canManage = canRole(channel.role, 'gear.manage');
  const viewerZone = browserTimeZone();
  const [editing, setEditing] = useState<Gear | 'new' | null>(null);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'dueBackOn', desc: false }]);
  const [columnFilters, setColumnFilters] = useState<ColumnFiltersState>([]);
  const [globalFilter, setGlobalFilter] = useState('');

  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('kind', { header: 'Kind', cell: (c) => GEAR_KIND_LABELS[c.getValue()], filterFn: 'equalsString', enableGlobalFilter: false }),
        helper.accessor('make', { header: 'Make', sortFn: 'text' }),
        helper.accessor('model', { header: 'Model', sortFn: 'text' }),
        helper.accessor((g) => g.serial ?? '', { id: 'serial', header: 'Serial', sortFn: 'alphanumeric', cell: (c) => (c.getValue() ? <span className="whitespace-nowrap">{c.getValue()}</span> : <span className="text-ink-muted">—</span>) }),
        helper.accessor('source', {
          header: 'Source',
          filterFn: 'equalsString',
          enableGlobalFilter: false,
          cell: (c) => (
            <>
              {GEAR_SOURCE_LABELS[c.getValue()]}
              {c.row.original.sponsored && <span className="block text-xs text-warn">Sponsored: disclose</span>}
            </>
          ),
        }),
        helper.accessor((g) => g.receivedOn ?? '', { id: 'receivedOn', header: 'Received', sortFn: 'text', sortUndefined: 'last', enableGlobalFilter: false, cell: (c) => <span className="whitespace-nowrap">{day(c.row.original.receivedOn)}</span> }),
        helper.accessor((g) => g.dueBackOn ?? undefined, {
          id: 'dueBackOn',
          header: 'Due back',
          sortFn: 'text',
          sortUndefined: 'last',
          enableGlobalFilter: false,
          cell: (c) => <span className="whitespace-nowrap">{day(c.row.original.dueBackOn)}</span>,
        }),
        helper.accessor((g) => g.embargoAt ?? undefined, { id: 'embargo', header: 'Embargo', sortFn: 'text', sortUndefined: 'last', enableGlobalFilter: false, cell: (c) => <EmbargoCell gear={c.row.original} viewerZone={viewerZone} /> }),
        helper.accessor('notes', { header: 'Notes', enableSorting: false, cell: (c) => <p className="line-clamp-2 max-w-[16rem] text-ink-soft">{c.getValue()}</p> }),
        helper.accessor('episodeCount', { header: 'Episodes', enableGlobalFilter: false }),
        helper.display({
          id: 'actions',
          header: () => <span className="sr-only">Actions</span>,
          cell: (c) =>
            canManage ? (
              <Button variant="ghost" onClick={() => setEditing(c.row.original)} aria-label={`Edit ${c.row.original.make} ${c.row.original.model}`}>
                Edit
              </Button>
            ) : null,
        }),
      ]),
    [canManage, viewerZone],
  );
  const data = useMemo(() => gear.data ?? [], [gear.data]);
  const table = useTable({
    features,
    columns,
    data,
    state: { sorting, columnFilters, globalFilter },
    onSortingChange: setSorting,
    onColumnFiltersChange: setColumnFilters,
    onGlobalFilterChange: setGlobalFilter,
    globalFilterFn: 'includesString',
    getRowId: (g) => g.id,
  });
  const filterOf = (id: string) => (columnFilters.find((f) => f.id === id)?.value as string | undefined) ?? '';
  const setFilter = (id: string, value: string) => setColumnFilters((fs) => [...fs.filter((f) => f.id !== id), ...(value ? [{ id, value }] : [])]);
  const rows = table.getRowModel().rows;

  return (
    <div>
      <PageHeader
        title="Gear"
        description="Everything under test: where it came from, when it goes back, and when its embargo lifts (in the zone it was announced in, and in yours)."
        actions={
          canManage && (
            <Button variant="primary" onClick={() => setEditing('new')}>
              Add gear
            </Button>
          )
        }
      />
      <Panel>
        <form role="search" aria-label="Filter the gear list" className="mb-3 flex flex-wrap items-end gap-2" onSubmit={(e) => e.preventDefault()}>
          <label className="flex min-w-[12rem] flex-1 flex-col gap-1 text-xs font-medium text-ink-soft sm:max-w-xs">
            Search make, model, serial, notes
            <input type="search" className="rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm text-ink" value={globalFilter} onChange={(e) => setGlobalFilter(e.target.value)} />
          </label>
          <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
            Kind
            <select className="rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm text-ink" value={filterOf('kind')} onChange={(e) => setFilter('kind', e.target.value)}>
              <option value="">All kinds</option>
              {GEAR_KINDS.map((k) => (
                <option key={k} value={k}>
                  {GEAR_KIND_LABELS[k]}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
            Source
            <select className="rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm text-ink" value={filterOf('source')} onChange={(e) => setFilter('source', e.target.value)}>
              <option value="">All sources</option>
              {GEAR_SOURCES.map((s) => (
                <option key={s} value={s}>
                  {GEAR_SOURCE_LABELS[s]}
                </option>
              ))}
            </select>
          </label>
          <label className="flex items-center gap-2 self-end rounded-md border border-line-strong bg-card px-2.5 py-1.5 text-sm">
            <input type="checkbox" checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} />
            Show archived
          </label>
          <p className="self-end py-1.5 text-xs text-ink-muted sm:ml-auto" aria-live="polite">
            {rows.length} of {data.length} items
          </p>
        </form>
        {gear.isLoading && <Loading what="Loading the gear list" />}
        {gear.error && <ErrorNote error={gear.error} />}
        {gear.data && (
          <div className="relative -mx-4 overflow-x-auto px-4">
            <table className="w-full min-w-[60rem] border-collapse text-left text-sm">
              <caption className="sr-only">Gear of {channel.name}; column headers sort the table</caption>
              <thead>
                {table.getHeaderGroups().map((group) => (
                  <tr key={group.id} className="border-b border-line-strong">
                    {group.headers.map((header) => {
                      const sorted = header.column.getIsSorted();
                      return (
                        <th key={header.id} scope="col" className="px-2 py-2 align-bottom text-xs font-semibold whitespace-nowrap text-ink-soft" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                          {header.isPlaceholder ? null : header.column.getCanSort() ? (
                            <button type="button" className="inline-flex items-center gap-1 hover:text-ink" onClick={header.column.getToggleSortingHandler()}>
                              <table.FlexRender header={header} />
                              <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                            </button>
                          ) : (
                            <table.FlexRender header={header} />
                          )}
                        </th>
                      );
                    })}
                  </tr>
                ))}
              </thead>
              <tbody>
                {rows.map((row) => (
                  <tr key={row.id} className={`border-b border-line align-top ${row.original.archivedAt ? 'text-ink-muted' : ''}`}>
                    {row.getAllCells().map((cell) => (
                      <td key={cell.id} className="px-2 py-2">
                        <table.FlexRender cell={cell} />
                      </td>
                    ))}
                  </tr>
                ))}
                {rows.length === 0 && (
                  <tr>
                    <td colSpan={columns.length} className="px-2 py-6 text-center text-ink-muted">
                      {data.length === 0 ? 'No gear yet.' : 'Nothing matches the filters.'}
                    </td>
                  </tr>
                )}
              </tbody>
            </table>
          </div>
        )}
      </Panel>
      {editing && <GearDialog gear={editing === 'new' ? null : editing} channelId={channel.id} channelZone={channel.timeZone} onClose={() => setEditing(null)} />}
    </div>
  );
}
