import { Suspense, useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import {
  canRole,
  episodeDateFlags,
  episodeFormToInput,
  formatInstantInZone,
  gearName,
  GEAR_SOURCE_LABELS,
  MOVE_INDEX_END,
  nextKeyDate,
  STAGE_LABELS,
  type ActivityEntry,
  type EpisodeDetail,
  type Stage,
} from '@midgray/shared';
import { EPISODE_TABS } from '../../../app/episode-tabs.tsx';
import { Avatar } from '../../../components/ui/avatar.tsx';
import { Button } from '../../../components/ui/button.tsx';
import { Dialog } from '../../../components/ui/dialog.tsx';
import { ErrorNote, Loading, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { browserTimeZone } from '../../../lib/time-zones.ts';
import { useCurrentChannel } from '../../channels/current-channel.tsx';
import { boardQueryOptions, useBoard, useMoveEpisode } from '../api/board.ts';
import { useArchiveEpisode, useEpisode, useUpdateEpisode } from '../api/episodes.ts';
import { directionOf } from '../board-model.ts';
import { formatDay, formatInstant, formatWeek } from '../dates.ts';
import { EpisodeFormFields } from './episode-form.tsx';
import { DateFlags, KeyDateLine } from './key-date.tsx';
import { ReasonDialog, type PendingBackMove } from './reason-dialog.tsx';
import { StageOptions } from './stage-options.tsx';

/** The episode page: header (stage, people, gear, key dates, date flags), the feature tabs, and the activity list. */
export function EpisodePage() {
  const { id = '' } = useParams();
  const episode = useEpisode(id);
  if (episode.isLoading) return <Loading what="Loading the episode" />;
  if (episode.error) return <ErrorNote error={episode.error} />;
  if (!episode.data) return null;
  return <EpisodeView episode={episode.data} />;
}

function EpisodeView({ episode }: { episode: EpisodeDetail }) {
  const { channels } = useCurrentChannel();
  const channel = channels.find((c) => c.id === episode.channelId);
  const role = channel?.role ?? 'editor';
  const timeZone = channel?.timeZone ?? 'UTC';
  const viewerZone = browserTimeZone();
  const [editing, setEditing] = useState(false);
  const now = useMemo(() => new Date().toISOString(), [episode]);
  const dates = useMemo(
    () => ({
      stage: episode.stage,
      shootDate: episode.shootDate,
      gear: episode.gear.map((g) => ({ name: gearName(g), dueBackOn: g.dueBackOn, embargoAt: g.embargoAt, embargoZone: g.embargoZone })),
      slots: episode.slots,
    }),
    [episode],
  );
  const flags = episodeDateFlags(dates);
  const next = nextKeyDate(dates, now, timeZone);
  const approved = episode.slots.find((s) => s.status === 'approved');
  const proposed = episode.slots.find((s) => s.status === 'proposed');
  const canEdit = canRole(role, 'episode.create');

  return (
    <div className="flex flex-col gap-5">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-muted">
        <Link to={episode.archivedAt ? '/archive' : '/board'} className="hover:text-ink hover:underline">
          {episode.archivedAt ? 'Archive' : 'Board'}
        </Link>{' '}
        › {STAGE_LABELS[episode.stage]}
      </nav>
      <header className="flex flex-col gap-3">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div className="min-w-0">
            <h1 className="text-2xl font-bold break-words">{episode.title}</h1>
            <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-ink-soft">
              <span className="rounded-full border border-ink/20 bg-card px-2.5 py-0.5 font-semibold text-ink">Stage: {STAGE_LABELS[episode.stage]}</span>
              {episode.archivedAt && <span className="rounded-full bg-warn-soft px-2.5 py-0.5 font-semibold text-warn">Archived {formatInstant(episode.archivedAt, timeZone)}</span>}
              {episode.footageCount !== null && (
                <span className="rounded-full bg-paper px-2.5 py-0.5">
                  {episode.footageCount} footage {episode.footageCount === 1 ? 'file' : 'files'}
                </span>
              )}
              {episode.openSpecLines !== null && (
                <span className="rounded-full bg-paper px-2.5 py-0.5">
                  {episode.openSpecLines} open spec-sheet {episode.openSpecLines === 1 ? 'line' : 'lines'}
                </span>
              )}
            </p>
          </div>
          <EpisodeActions episode={episode} onEdit={() => setEditing(true)} canEdit={canEdit} />
        </div>
        <div className="grid gap-4 lg:grid-cols-3">
          <Panel title="People">
            <ul className="flex flex-col gap-2 text-sm">
              {(
                [
                  ['Host', episode.host],
                  ['Editor', episode.editor],
                ] as const
              ).map(([label, person]) => (
                <li key={label} className="flex items-center gap-2">
                  {person ? <Avatar name={person.name} size="sm" /> : <span className="inline-block h-6 w-6 rounded-full border border-dashed border-line-strong" aria-hidden="true" />}
                  <span className="text-ink-muted">{label}:</span> <span className="font-medium">{person?.name ?? 'nobody yet'}</span>
                </li>
              ))}
            </ul>
          </Panel>
          <Panel title="Key dates">
            <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
              <dt className="text-ink-muted">Shoot</dt>
              <dd>{episode.shootDate ? formatDay(episode.shootDate) : 'not set'}</dd>
              <dt className="text-ink-muted">Target publish</dt>
              <dd>{episode.targetPublishWeek ? formatWeek(episode.targetPublishWeek) : 'not set'}</dd>
              <dt className="text-ink-muted">Publish slot</dt>
              <dd>
                {approved ? `${formatInstant(approved.startsAt, approved.zone)} (${approved.zone}), approved` : proposed ? `${formatInstant(proposed.startsAt, proposed.zone)} (${proposed.zone}), proposed` : 'none yet'}
              </dd>
              {episode.publicUrl && (
                <>
                  <dt className="text-ink-muted">Published</dt>
                  <dd className="min-w-0 truncate">
                    <a href={episode.publicUrl} className="text-accent-strong underline" target="_blank" rel="noreferrer">
                      {episode.publicUrl}
                    </a>
                  </dd>
                </>
              )}
            </dl>
            <div className="mt-3 flex flex-col gap-1.5">
              {next ? <KeyDateLine date={next} /> : <p className="text-xs text-ink-muted">No date coming up.</p>}
              <DateFlags flags={flags} />
            </div>
          </Panel>
          <Panel title="Gear">
            {episode.gear.length === 0 ? (
              <p className="text-sm text-ink-muted">No gear chosen.</p>
            ) : (
              <ul className="flex flex-col gap-2 text-sm">
                {episode.gear.map((g) => (
                  <li key={g.id}>
                    <p className="font-medium">
                      {gearName(g)}
                      {g.archivedAt ? <span className="text-ink-muted"> (archived)</span> : null}
                    </p>
                    <p className="text-xs text-ink-muted">
                      {GEAR_SOURCE_LABELS[g.source]}
                      {g.sponsored ? ', sponsored' : ''}
                      {g.dueBackOn ? ` · due back ${formatDay(g.dueBackOn)}` : ''}
                    </p>
                    {g.embargoAt && g.embargoZone && (
                      <p className="text-xs text-ink-muted">
                        Embargo lifts {formatInstantInZone(g.embargoAt, g.embargoZone)}
                        {viewerZone !== g.embargoZone && <> · your time {formatInstantInZone(g.embargoAt, viewerZone)}</>}
                      </p>
                    )}
                  </li>
                ))}
              </ul>
            )}
          </Panel>
        </div>
      </header>
      <EpisodeTabs episodeId={episode.id} channelId={episode.channelId} />
      <Panel title="Activity">
        <p className="-mt-2 mb-2 text-xs text-ink-muted">Times in the channel’s zone, {timeZone}.</p>
        <ActivityList entries={episode.activity} timeZone={timeZone} />
      </Panel>
      {editing && <EditEpisodeDialog episode={episode} onClose={() => setEditing(false)} />}
    </div>
  );
}

function EpisodeActions({ episode, canEdit, onEdit }: { episode: EpisodeDetail; canEdit: boolean; onEdit: () => void }) {
  const move = useMoveEpisode(episode.channelId, boardQueryOptions(episode.channelId).queryKey);
  const archive = useArchiveEpisode();
  const toast = useToast();
  const [pending, setPending] = useState<PendingBackMove | null>(null);
  const doMove = (toStage: Stage, reason?: string) =>
    move.mutate(
      // The end of the target column: the server clamps the index, the schema caps it at 100 000.
      { episodeId: episode.id, toStage, toIndex: 100_000, version: episode.version, reason },
      {
        onSuccess: () => toast({ tone: 'success', title: `Moved to ${STAGE_LABELS[toStage]}` }),
        onError: (err) => {
          const missing = err instanceof ApiError ? (err.details as { missing?: string[] } | undefined)?.missing : undefined;
          toast({ tone: 'error', title: missing ? `It stays in ${STAGE_LABELS[episode.stage]}: it cannot move to ${STAGE_LABELS[toStage]} yet` : err.message, lines: missing });
        },
      },
    );
  const onArchive = (archiveIt: boolean) =>
    archive.mutate(
      { episodeId: episode.id, version: episode.version, archive: archiveIt },
      {
        onSuccess: () => toast({ tone: 'success', title: archiveIt ? 'Archived: it is off the board and listed in the archive' : `Restored to ${STAGE_LABELS[episode.stage]}` }),
        onError: (err) => toast({ tone: 'error', title: err.message }),
      },
    );
  return (
    <div className="flex flex-wrap items-center gap-2">
      {!episode.archivedAt && (
        <select
          aria-label="Move this episode to"
          className="min-h-9 rounded-md border border-line-strong bg-card px-2 text-sm"
          value=""
          disabled={move.isPending}
          onChange={(e) => {
            const to = e.target.value as Stage;
            if (!to) return;
            if (directionOf(episode.stage, to) === 'back') setPending({ title: episode.title, from: episode.stage, to, confirm: (reason) => doMove(to, reason) });
            else doMove(to);
          }}
        >
          <option value="">Move to…</option>
          <StageOptions stage={episode.stage} />
        </select>
      )}
      {canEdit && !episode.archivedAt && <Button onClick={onEdit}>Edit</Button>}
      {canEdit && (
        <Button variant={episode.archivedAt ? 'primary' : 'danger'} onClick={() => onArchive(!episode.archivedAt)} disabled={archive.isPending}>
          {episode.archivedAt ? 'Restore to the board' : 'Archive'}
        </Button>
      )}
      <ReasonDialog pending={pending} onClose={() => setPending(null)} />
    </div>
  );
}

function EpisodeTabs({ episodeId, channelId }: { episodeId: string; channelId: string }) {
  const [params, setParams] = useSearchParams();
  const current = EPISODE_TABS.find((t) => t.key === params.get('tab')) ?? EPISODE_TABS[0];
  return (
    <section className="flex flex-col">
      <div role="tablist" aria-label="Episode work" className="-mb-px flex gap-1 overflow-x-auto border-b border-line">
        {EPISODE_TABS.map((t) => {
          const selected = t.key === current.key;
          return (
            <button
              key={t.key}
              id={`tab-${t.key}`}
              role="tab"
              type="button"
              aria-selected={selected}
              aria-controls={`panel-${t.key}`}
              tabIndex={selected ? 0 : -1}
              onClick={() => setParams((p) => (p.set('tab', t.key), p), { replace: true })}
              onKeyDown={(e) => {
                const i = EPISODE_TABS.indexOf(t);
                const next = e.key === 'ArrowRight' ? EPISODE_TABS[(i + 1) % EPISODE_TABS.length] : e.key === 'ArrowLeft' ? EPISODE_TABS[(i - 1 + EPISODE_TABS.length) % EPISODE_TABS.length] : null;
                if (next) {
                  setParams((p) => (p.set('tab', next.key), p), { replace: true });
                  document.getElementById(`tab-${next.key}`)?.focus();
                }
              }}
              className={`rounded-t-md border px-3 py-2 text-sm font-semibold whitespace-nowrap ${selected ? 'border-line border-b-card bg-card text-ink' : 'border-transparent text-ink-soft hover:text-ink'}`}
            >
              {t.label}
            </button>
          );
        })}
      </div>
      <div role="tabpanel" id={`panel-${current.key}`} aria-labelledby={`tab-${current.key}`} className="rounded-b-lg rounded-tr-lg border border-line bg-card p-4" tabIndex={0}>
        {current.Component ? (
          <Suspense fallback={<Loading what={`Loading ${current.label}`} />}>
            <current.Component episodeId={episodeId} channelId={channelId} />
          </Suspense>
        ) : (
          <p className="text-sm text-ink-soft">The {current.label} tab is not built yet.</p>
        )}
      </div>
    </section>
  );
}

const STAGE_NAME = (v: string | null) => (v && v in STAGE_LABELS ? STAGE_LABELS[v as Stage] : (v ?? '—'));

/** One activity line in words: who did what, from → to. */
function describe(a: ActivityEntry): string {
  const field = typeof a.details.field === 'string' ? a.details.field : null;
  switch (a.action) {
    case 'episode.created':
      return 'created the episode';
    case 'episode.moved':
      return `moved it ${a.details.direction === 'back' ? 'back ' : ''}from ${STAGE_NAME(a.fromValue)} to ${STAGE_NAME(a.toValue)}`;
    case 'episode.updated':
      return `changed the ${field ?? 'details'}: ${a.fromValue ?? '—'} → ${a.toValue ?? '—'}`;
    case 'episode.assigned':
      return `changed the ${field ?? 'assignment'}: ${a.fromValue ?? 'nobody'} → ${a.toValue ?? 'nobody'}`;
    case 'episode.archived':
      return `archived it (it was in ${STAGE_NAME(a.fromValue)})`;
    case 'episode.unarchived':
      return `restored it to ${STAGE_NAME(a.toValue)}`;
    default: {
      const words = a.action.replace(/[._]/g, ' ');
      const change = a.fromValue || a.toValue ? `: ${a.fromValue ?? '—'} → ${a.toValue ?? '—'}` : '';
      return `${words}${change}`;
    }
  }
}

function ActivityList({ entries, timeZone }: { entries: ActivityEntry[]; timeZone: string }) {
  if (entries.length === 0) return <p className="text-sm text-ink-muted">Nothing yet.</p>;
  return (
    <ol className="flex flex-col divide-y divide-line text-sm">
      {entries.map((a) => (
        <li key={a.id} className="flex flex-col gap-0.5 py-2 sm:flex-row sm:gap-3">
          <time dateTime={a.createdAt} className="shrink-0 text-xs text-ink-muted sm:w-48 sm:pt-0.5">
            {formatInstant(a.createdAt, timeZone)}
          </time>
          <div className="min-w-0">
            <p>
              <span className="font-semibold">{a.actorName ?? 'Someone'}</span> {describe(a)}
            </p>
            {a.reason && <p className="mt-0.5 border-l-2 border-line-strong pl-2 text-ink-soft">Reason: {a.reason}</p>}
          </div>
        </li>
      ))}
    </ol>
  );
}

function EditEpisodeDialog({ episode, onClose }: { episode: EpisodeDetail; onClose: () => void }) {
  const board = useBoard(episode.channelId);
  const update = useUpdateEpisode(episode.id);
  const toast = useToast();
  const initial = {
    title: episode.title,
    gearIds: episode.gear.map((g) => g.id),
    hostId: episode.host?.id ?? '',
    editorId: episode.editor?.id ?? '',
    targetPublishWeek: episode.targetPublishWeek ?? '',
    shootDate: episode.shootDate ?? '',
  };
  return (
    <Dialog open onClose={onClose} title="Edit episode" wide>
      {board.data ? (
        <EpisodeFormFields
          initial={initial}
          gear={board.data.gear}
          people={board.data.people}
          submitLabel="Save changes"
          pending={update.isPending}
          onCancel={onClose}
          onSubmit={async (values) => {
            await update.mutateAsync({ version: episode.version, ...episodeFormToInput(values) });
            toast({ tone: 'success', title: 'Saved' });
            onClose();
          }}
        />
      ) : (
        <Loading what="Loading the gear list" />
      )}
    </Dialog>
  );
}
