// The episode's footage: kind, step, size, duration, status, holder and spec mismatches, with
// sorting by any column, filters by kind, state and name, and the actions a role may take.
import { Fragment, useMemo, useState } from 'react';
import { FOOTAGE_KIND_LABELS, FOOTAGE_KINDS, FOOTAGE_STATE_LABELS, FOOTAGE_STATES, type Footage, type Role } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { useFootageHolders, usePickUp, useReassign, useRelease } from '../api/footage.ts';
import { FootageDetails } from './footage-details.tsx';
import { FootageStatusBadge } from './footage-status.tsx';
import { formatBytes, formatDuration } from './format.ts';

type SortKey = 'name' | 'kind' | 'step' | 'size' | 'duration' | 'status' | 'holder' | 'mismatches' | 'added';
const STATE_ORDER = { flagged: 0, receiving: 1, received: 2, verified: 3 } as const;

const sortValue: Record<SortKey, (f: Footage) => string | number> = {
  name: (f) => f.originalName.toLowerCase(),
  kind: (f) => FOOTAGE_KIND_LABELS[f.kind],
  step: (f) => f.stepLabel ?? '~',
  size: (f) => f.sizeBytes,
  duration: (f) => f.probe?.durationSeconds ?? -1,
  status: (f) => STATE_ORDER[f.status],
  holder: (f) => f.holder?.name ?? '~',
  mismatches: (f) => f.specMismatches?.length ?? -1,
  added: (f) => f.createdAt,
};

const COLUMNS: { key: SortKey; label: string; className?: string }[] = [
  { key: 'name', label: 'File' },
  { key: 'kind', label: 'Kind' },
  { key: 'step', label: 'Step' },
  { key: 'size', label: 'Size', className: 'text-right' },
  { key: 'duration', label: 'Duration', className: 'text-right' },
  { key: 'status', label: 'Status' },
  { key: 'holder', label: 'Held by' },
  { key: 'mismatches', label: 'Spec' },
];

export function FootageTable({ footage, episodeId, channelId, me }: { footage: Footage[]; episodeId: string; channelId: string; me: { id: string; role: Role } }) {
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: 'added', dir: -1 });
  const [kind, setKind] = useState('');
  const [state, setState] = useState('');
  const [text, setText] = useState('');
  const [open, setOpen] = useState<string | null>(null);
  const toast = useToast();
  const pickUp = usePickUp(episodeId);
  const release = useRelease(episodeId);
  const reassign = useReassign(episodeId);
  const canPickUp = me.role !== 'host';
  const canAssign = me.role === 'producer' || me.role === 'admin';
  const holders = useFootageHolders(channelId, canAssign);
  const fail = (err: Error) => toast({ tone: 'error', title: err.message });

  const rows = useMemo(() => {
    const q = text.trim().toLowerCase();
    const list = footage.filter((f) => (!kind || f.kind === kind) && (!state || f.status === state) && (!q || f.originalName.toLowerCase().includes(q) || (f.stepLabel ?? '').toLowerCase().includes(q)));
    const get = sortValue[sort.key];
    return [...list].sort((a, b) => {
      const x = get(a);
      const y = get(b);
      return (x < y ? -1 : x > y ? 1 : 0) * sort.dir;
    });
  }, [footage, kind, state, text, sort]);

  const header = (c: (typeof COLUMNS)[number]) => {
    const active = sort.key === c.key;
    return (
      <th key={c.key} scope="col" className={`px-2 py-2 font-semibold ${c.className ?? 'text-left'}`} aria-sort={active ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'}>
        <button type="button" className="inline-flex items-center gap-1 hover:text-ink" onClick={() => setSort((s) => ({ key: c.key, dir: s.key === c.key ? ((-s.dir) as 1 | -1) : 1 }))}>
          {c.label}
          <span aria-hidden="true" className="text-ink-muted">{active ? (sort.dir === 1 ? '▲' : '▼') : '↕'}</span>
        </button>
      </th>
    );
  };

  return (
    <div>
      <div className="mb-3 grid gap-3 sm:grid-cols-3">
        <TextField label="Find" placeholder="File name or step" value={text} onChange={(e) => setText(e.target.value)} />
        <SelectField label="Kind" value={kind} onChange={(e) => setKind(e.target.value)}>
          <option value="">All kinds</option>
          {FOOTAGE_KINDS.map((k) => (
            <option key={k} value={k}>
              {FOOTAGE_KIND_LABELS[k]}
            </option>
          ))}
        </SelectField>
        <SelectField label="Status" value={state} onChange={(e) => setState(e.target.value)}>
          <option value="">All states</option>
          {FOOTAGE_STATES.map((s) => (
            <option key={s} value={s}>
              {FOOTAGE_STATE_LABELS[s]}
            </option>
          ))}
        </SelectField>
      </div>
      {rows.length === 0 ? (
        <p className="rounded-md border border-dashed border-line-strong p-4 text-sm text-ink-muted">{footage.length ? 'No file matches these filters.' : 'No footage yet: upload the first files above.'}</p>
      ) : (
        <div className="relative max-w-full overflow-x-auto rounded-md border border-line">
          <table className="w-full min-w-[860px] text-sm">
            <caption className="sr-only">Footage of this episode</caption>
            <thead className="bg-paper text-ink-soft">
              <tr>
                {COLUMNS.map(header)}
                <th scope="col" className="px-2 py-2 text-right font-semibold">
                  Actions
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((f) => {
                const expanded = open === f.id;
                const mine = f.holder?.id === me.id;
                const busy = pickUp.isPending || release.isPending || reassign.isPending;
                return (
                  <Fragment key={f.id}>
                    <tr className="border-t border-line align-top">
                      <td className="max-w-[16rem] px-2 py-2">
                        <button type="button" className="text-left font-semibold text-ink underline-offset-2 hover:underline" aria-expanded={expanded} onClick={() => setOpen(expanded ? null : f.id)}>
                          <span id={`footage-name-${f.id}`} className="break-all">
                            {f.originalName}
                          </span>
                        </button>
                        <div className="text-xs text-ink-muted">
                          {f.uploader ? `by ${f.uploader.name}, ` : ''}
                          {new Date(f.createdAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}
                        </div>
                      </td>
                      <td className="px-2 py-2 whitespace-nowrap">{FOOTAGE_KIND_LABELS[f.kind]}</td>
                      <td className="px-2 py-2">{f.stepLabel ?? <span className="text-ink-muted">—</span>}</td>
                      <td className="px-2 py-2 text-right whitespace-nowrap tabular-nums">{formatBytes(f.sizeBytes)}</td>
                      <td className="px-2 py-2 text-right tabular-nums">{formatDuration(f.probe?.durationSeconds)}</td>
                      <td className="px-2 py-2">
                        <FootageStatusBadge f={f} />
                      </td>
                      <td className="px-2 py-2">
                        {f.holder ? (
                          <>
                            <div className="font-medium">{f.holder.name}</div>
                            <div className="text-xs text-ink-muted">since {new Date(f.heldSince!).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}</div>
                          </>
                        ) : (
                          <span className="text-ink-muted">Nobody</span>
                        )}
                      </td>
                      <td className="px-2 py-2">
                        {f.specMismatches === null ? (
                          <span className="text-ink-muted">—</span>
                        ) : f.specMismatches.length ? (
                          <ul className="space-y-0.5 text-xs text-danger">
                            {f.specMismatches.map((m) => (
                              <li key={m.key}>
                                <span className="font-semibold">{m.label}</span>: {m.actual} (sheet {m.expected})
                              </li>
                            ))}
                          </ul>
                        ) : (
                          <span className="text-ok">Matches</span>
                        )}
                      </td>
                      <td className="px-2 py-2">
                        <div className="flex flex-wrap justify-end gap-1.5">
                          {f.status !== 'receiving' && (
                            <a className="inline-flex min-h-9 items-center rounded-md border border-line-strong px-3 text-sm font-semibold hover:bg-paper" href={`/api/footage/${f.id}/download`} download aria-describedby={`footage-name-${f.id}`}>
                              Download
                            </a>
                          )}
                          {canPickUp && f.status !== 'receiving' && !f.holder && (
                            <Button disabled={busy} aria-describedby={`footage-name-${f.id}`} onClick={() => pickUp.mutate(f, { onError: fail })}>
                              Pick up
                            </Button>
                          )}
                          {f.holder && (mine || canAssign) && (
                            <Button variant="ghost" disabled={busy} aria-describedby={`footage-name-${f.id}`} onClick={() => release.mutate(f, { onError: fail })}>
                              Release
                            </Button>
                          )}
                          {canAssign && f.status !== 'receiving' && holders.data && (
                            <select
                              aria-label={`Hand ${f.originalName} to`}
                              className="min-h-9 rounded-md border border-line-strong bg-card px-2 text-sm"
                              value=""
                              disabled={busy}
                              onChange={(e) => e.target.value && reassign.mutate({ footage: f, userId: e.target.value }, { onError: fail })}
                            >
                              <option value="">Hand to…</option>
                              {holders.data
                                .filter((m) => m.userId !== f.holder?.id)
                                .map((m) => (
                                  <option key={m.userId} value={m.userId}>
                                    {m.name} ({m.role})
                                  </option>
                                ))}
                            </select>
                          )}
                        </div>
                      </td>
                    </tr>
                    {expanded && (
                      <tr className="border-t border-line bg-paper/60">
                        <td colSpan={COLUMNS.length + 1}>
                          <FootageDetails f={f} />
                        </td>
                      </tr>
                    )}
                  </Fragment>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
