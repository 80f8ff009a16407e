import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import {
  formatInstantWithZoneName,
  formatLocalDateTime,
  isValidTimeZone,
  ProposeSlotInputSchema,
  STAGE_LABELS,
  zonedTimeToInstant,
  type EpisodeSchedule,
  type ProposeSlotInput,
} from '@midgray/shared';
import type { EpisodeTabProps } from '../../../app/episode-tabs.tsx';
import { Button } from '../../../components/ui/button.tsx';
import { TextAreaField, TextField } from '../../../components/ui/field.tsx';
import { ErrorNote, Loading, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ZonePicker } from '../../../components/ui/zone-picker.tsx';
import { browserTimeZone } from '../../../lib/time-zones.ts';
import { useMarkLive, useProposeSlot, useSchedule } from '../api/schedule.ts';
import { DecisionForm } from './decision-form.tsx';
import { SlotStatusBadge, SlotTimes } from './slot-text.tsx';

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** The Schedule tab: the current publish slot and its approval, proposing a new one, going live, history. */
export default function ScheduleTab({ episodeId }: EpisodeTabProps) {
  const schedule = useSchedule(episodeId);
  if (schedule.isLoading) return <Loading what="Loading the schedule" />;
  if (schedule.error) return <ErrorNote error={schedule.error} />;
  if (!schedule.data) return null;
  return <ScheduleView s={schedule.data} />;
}

function ScheduleView({ s }: { s: EpisodeSchedule }) {
  const viewerZone = browserTimeZone();
  const channelZone = s.episode.channelTimeZone;
  const current = s.current;
  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <div className="flex min-w-0 flex-col gap-5">
        <Panel title="Publish slot">
          <p className="mb-3 text-sm text-ink-soft">
            The episode is in <span className="font-semibold text-ink">{STAGE_LABELS[s.episode.stage]}</span>.
            {s.episode.publicUrl && (
              <>
                {' '}
                Published at{' '}
                <a className="text-accent underline" href={s.episode.publicUrl} target="_blank" rel="noreferrer">
                  {s.episode.publicUrl}
                </a>
                .
              </>
            )}
          </p>
          {current ? (
            <div className="flex flex-col gap-3">
              <div className="flex flex-wrap items-center gap-2">
                <SlotStatusBadge status={current.status} />
                <span className="text-sm text-ink-soft">
                  {current.status === 'proposed'
                    ? `by ${current.proposedBy?.name ?? 'someone'} on ${when(current.proposedAt)} — waiting for a producer`
                    : `by ${current.decidedBy?.name ?? 'a producer'}${current.decidedAt ? ` on ${when(current.decidedAt)}` : ''}`}
                </span>
              </div>
              <SlotTimes slot={current} channelZone={channelZone} viewerZone={viewerZone} />
              {current.proposalNote && <p className="text-sm">Note from {current.proposedBy?.name ?? 'the proposer'}: {current.proposalNote}</p>}
              {current.comment && <p className="text-sm">Comment: {current.comment}</p>}
              {s.canDecide && current.status === 'proposed' && s.episode.stage === 'approval' && <DecisionForm slotId={current.id} title={s.episode.title} />}
              {current.status === 'proposed' && s.episode.stage !== 'approval' && (
                <p className="text-sm text-ink-muted">A producer can decide once the episode is in Approval (it needs a description draft and this slot).</p>
              )}
            </div>
          ) : (
            <p className="text-sm text-ink-muted">No publish slot proposed yet.</p>
          )}
        </Panel>
        <EmbargoList s={s} viewerZone={viewerZone} />
        {s.canDecide && s.episode.stage === 'scheduled' && current?.status === 'approved' && <GoLive s={s} />}
      </div>
      <div className="flex min-w-0 flex-col gap-5">
        {s.canPropose ? <ProposeForm s={s} viewerZone={viewerZone} /> : s.episode.stage === 'live' ? null : <Panel title="Propose a slot"><p className="text-sm text-ink-muted">Your role cannot propose publish slots.</p></Panel>}
        <History s={s} />
      </div>
    </div>
  );
}

function EmbargoList({ s, viewerZone }: { s: EpisodeSchedule; viewerZone: string }) {
  if (s.embargoes.length === 0) return <Panel title="Embargoes"><p className="text-sm text-ink-muted">No gear of this episode is under embargo.</p></Panel>;
  const slotMs = s.current ? Date.parse(s.current.startsAt) : null;
  return (
    <Panel title="Embargoes">
      <ul className="flex flex-col gap-2 text-sm">
        {s.embargoes.map((e) => {
          const early = slotMs !== null && slotMs < Date.parse(e.embargoAt);
          return (
            <li key={e.gearId} className={`rounded-md border-l-4 p-2 ${early ? 'border-danger bg-danger-soft' : 'border-line-strong bg-paper'}`}>
              <p className="font-semibold">{e.gearName}</p>
              <p>Lifts {formatInstantWithZoneName(e.embargoAt, e.zone)}</p>
              {viewerZone !== e.zone && <p className="text-ink-soft">Your time: {formatInstantWithZoneName(e.embargoAt, viewerZone)}</p>}
              {early && <p className="font-semibold text-danger">✕ The current slot is before this embargo: it cannot be approved.</p>}
            </li>
          );
        })}
      </ul>
    </Panel>
  );
}

function ProposeForm({ s, viewerZone }: { s: EpisodeSchedule; viewerZone: string }) {
  const toast = useToast();
  const propose = useProposeSlot(s.episode.id);
  const channelZone = s.episode.channelTimeZone;
  const start = s.current ? formatLocalDateTime(s.current.startsAt, s.current.zone).split(' ') : null;
  const form = useForm<ProposeSlotInput>({
    resolver: zodResolver(ProposeSlotInputSchema),
    defaultValues: { date: start?.[0] ?? '', time: start?.[1]?.slice(0, 5) ?? '18:00', zone: s.current?.zone ?? channelZone, comment: '' },
  });
  const [date, time, zone] = useWatch({ control: form.control, name: ['date', 'time', 'zone'] });

  // What the entered wall time means, before sending it.
  const preview = useMemo(() => {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(date ?? '') || !/^\d{2}:\d{2}$/.test(time ?? '') || !isValidTimeZone(zone ?? '')) return null;
    try {
      const instant = zonedTimeToInstant(`${date}T${time}`, zone);
      const skipped = formatLocalDateTime(instant, zone) !== `${date} ${time}`;
      const before = s.embargoes.filter((e) => Date.parse(instant) < Date.parse(e.embargoAt));
      return { instant, skipped, before, past: Date.parse(instant) <= Date.now() };
    } catch {
      return null;
    }
  }, [date, time, zone, s.embargoes]);

  const submit = form.handleSubmit((v) =>
    propose.mutate(
      { ...v, comment: v.comment?.trim() || undefined },
      {
        onError: (e) => toast({ tone: 'error', title: e.message }),
        onSuccess: (r) =>
          toast({
            tone: 'success',
            title: r.episode.stage === 'approval' ? 'Slot proposed; the producers were asked to approve it' : 'Slot proposed',
            lines: s.episode.stage === 'scheduled' ? ['The approved slot was replaced: the episode is back in Approval.'] : undefined,
          }),
      },
    ),
  );

  return (
    <Panel title={s.current ? 'Propose a different slot' : 'Propose a slot'}>
      <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField label="Date" type="date" {...form.register('date')} error={form.formState.errors.date?.message} />
          <TextField label="Time" type="time" step={60} {...form.register('time')} error={form.formState.errors.time?.message} />
        </div>
        <Controller
          control={form.control}
          name="zone"
          render={({ field, fieldState }) => (
            <ZonePicker
              label="Time zone"
              value={field.value}
              onChange={field.onChange}
              error={fieldState.error?.message}
              quick={[
                { label: 'Channel', zone: channelZone },
                { label: 'Mine', zone: viewerZone },
                { label: 'UTC', zone: 'UTC' },
              ]}
            />
          )}
        />
        {preview && (
          <div className="rounded-md bg-paper p-2.5 text-sm" aria-live="polite">
            {preview.skipped ? (
              <p className="font-semibold text-danger">
                {date} {time} does not exist in {zone}: the clocks go forward then. Pick another time.
              </p>
            ) : (
              <>
                <p>
                  Channel time: <span className="font-medium">{formatInstantWithZoneName(preview.instant, channelZone)}</span>
                </p>
                {viewerZone !== channelZone && (
                  <p>
                    Your time: <span className="font-medium">{formatInstantWithZoneName(preview.instant, viewerZone)}</span>
                  </p>
                )}
                {preview.past && <p className="font-semibold text-danger">This is in the past.</p>}
                {preview.before.map((e) => (
                  <p key={e.gearId} className="font-semibold text-danger">
                    ✕ Before the embargo of {e.gearName} ({formatInstantWithZoneName(e.embargoAt, e.zone)}): a producer cannot approve it.
                  </p>
                ))}
              </>
            )}
          </div>
        )}
        <TextAreaField label="Note for the producer (optional)" rows={2} {...form.register('comment')} error={form.formState.errors.comment?.message} />
        {s.episode.stage === 'scheduled' && (
          <p className="rounded-md border-l-4 border-warn bg-warn-soft p-2.5 text-sm">The approved slot will be replaced and the episode goes back to Approval until a producer approves the new one.</p>
        )}
        <div>
          <Button variant="primary" type="submit" disabled={propose.isPending}>
            Propose this slot
          </Button>
        </div>
      </form>
    </Panel>
  );
}

function GoLive({ s }: { s: EpisodeSchedule }) {
  const toast = useToast();
  const live = useMarkLive(s.episode.id);
  const [url, setUrl] = useState('');
  const due = s.current && Date.parse(s.current.startsAt) <= Date.now();
  return (
    <Panel title="Mark live">
      <form
        className="flex flex-col gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          live.mutate({ publicUrl: url.trim(), version: s.episode.version }, { onError: (err) => toast({ tone: 'error', title: err.message }), onSuccess: () => toast({ tone: 'success', title: 'The episode is live' }) });
        }}
      >
        <TextField label="Public URL of the video" type="url" placeholder="https://…" value={url} onChange={(e) => setUrl(e.target.value)} hint={due ? undefined : `Possible from ${formatInstantWithZoneName(s.current!.startsAt, s.episode.channelTimeZone)}.`} />
        <div>
          <Button variant="primary" type="submit" disabled={!due || url.trim() === '' || live.isPending}>
            Mark live
          </Button>
        </div>
      </form>
    </Panel>
  );
}

function History({ s }: { s: EpisodeSchedule }) {
  return (
    <Panel title="History">
      {s.history.length === 0 ? (
        <p className="text-sm text-ink-muted">Nothing yet.</p>
      ) : (
        <ol className="flex flex-col divide-y divide-line text-sm">
          {s.history.map((h) => (
            <li key={h.id} className="flex flex-col gap-1 py-2">
              <div className="flex flex-wrap items-center gap-2">
                <SlotStatusBadge status={h.status} />
                <span className="font-medium tabular-nums">{formatInstantWithZoneName(h.startsAt, h.zone)}</span>
              </div>
              <p className="text-ink-soft">
                Proposed by {h.proposedBy?.name ?? 'someone'} on {when(h.proposedAt)}
                {h.decidedBy && h.decidedAt && `; ${h.status === 'rejected' ? 'rejected' : 'approved'} by ${h.decidedBy.name} on ${when(h.decidedAt)}`}
              </p>
              {h.comment && <p>Comment: {h.comment}</p>}
            </li>
          ))}
        </ol>
      )}
    </Panel>
  );
}
