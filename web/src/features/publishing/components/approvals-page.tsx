import { useState } from 'react';
import { Link } from 'react-router-dom';
import { CALENDAR_EVENT_LABELS, type ApprovalQueueItem } from '@midgray/shared';
import { ErrorNote, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { ZonePicker } from '../../../components/ui/zone-picker.tsx';
import { useChannel } from '../../channels/current-channel.tsx';
import { browserTimeZone } from '../../../lib/time-zones.ts';
import { isValidTimeZone } from '@midgray/shared';
import { useApprovals } from '../api/approvals.ts';
import { DecisionForm } from './decision-form.tsx';
import { SlotStatusBadge } from './slot-text.tsx';

const SOURCE_TEXT = { loaner: 'loaner', rental: 'rental', owned: 'owned', purchased: 'purchased' } as const;

/** The producer's approval queue: every episode in Approval with what the decision depends on. */
export function ApprovalsPage() {
  const channel = useChannel();
  const [zone, setZone] = useState(browserTimeZone());
  const viewerZone = isValidTimeZone(zone) ? zone : channel.timeZone;
  const queue = useApprovals(channel.id, viewerZone);
  const canDecide = channel.role === 'producer' || channel.role === 'admin';

  return (
    <div>
      <PageHeader
        title="Approvals"
        description="Episodes waiting in Approval. Approving a slot schedules the episode; it is refused before any gear embargo lifts, or when a required disclosure is missing."
      />
      {!canDecide ? (
        <Panel>
          <p className="text-sm text-ink-soft">Only producers and admins decide publish slots. Your role here is {channel.role}.</p>
        </Panel>
      ) : (
        <>
          <div className="mb-4 max-w-md">
            <ZonePicker label="Show times also in" value={zone} onChange={setZone} quick={[{ label: 'Mine', zone: browserTimeZone() }, { label: 'Channel', zone: channel.timeZone }, { label: 'UTC', zone: 'UTC' }]} />
          </div>
          {queue.isLoading && <Loading what="Loading the queue" />}
          {queue.error && <ErrorNote error={queue.error} />}
          {queue.data?.items.length === 0 && (
            <Panel>
              <p className="text-sm text-ink-soft">Nothing waits for approval.</p>
            </Panel>
          )}
          <ul className="flex flex-col gap-4" aria-label="Episodes waiting for approval">
            {queue.data?.items.map((item) => (
              <li key={item.episode.id}>
                <QueueItem item={item} channelZone={queue.data.channelTimeZone} viewerZone={queue.data.viewerTimeZone} />
              </li>
            ))}
          </ul>
        </>
      )}
    </div>
  );
}

function QueueItem({ item, channelZone, viewerZone }: { item: ApprovalQueueItem; channelZone: string; viewerZone: string }) {
  const { episode, slot } = item;
  const headingId = `queue-${episode.id}`;
  return (
    <article aria-labelledby={headingId} className="rounded-lg border border-line bg-card p-4">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h2 id={headingId} className="text-lg font-semibold">
            <Link to={`/episodes/${episode.id}?tab=schedule`} className="hover:underline">
              {episode.title}
            </Link>
          </h2>
          <p className="text-sm text-ink-muted">
            Host {episode.host?.name ?? '—'} · Editor {episode.editor?.name ?? '—'}
          </p>
        </div>
        {slot && <SlotStatusBadge status={slot.status} />}
      </div>

      <div className="mt-3 grid gap-4 md:grid-cols-2 xl:grid-cols-4">
        <section aria-label="Publish slot">
          <h3 className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">Publish slot</h3>
          {slot ? (
            <dl className="text-sm">
              <dt className="text-ink-muted">Channel time</dt>
              <dd className="font-medium tabular-nums">{item.slotInChannelZone}</dd>
              {viewerZone !== channelZone && (
                <>
                  <dt className="mt-1 text-ink-muted">Your time</dt>
                  <dd className="font-medium tabular-nums">{item.slotInViewerZone}</dd>
                </>
              )}
              <dt className="mt-1 text-ink-muted">Proposed by</dt>
              <dd>{slot.proposedBy?.name ?? '—'}</dd>
              {slot.proposalNote && (
                <>
                  <dt className="mt-1 text-ink-muted">Note</dt>
                  <dd>{slot.proposalNote}</dd>
                </>
              )}
            </dl>
          ) : (
            <p className="text-sm text-ink-muted">No slot proposed.</p>
          )}
        </section>

        <section aria-label="Gear">
          <h3 className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">Gear</h3>
          {item.gear.length === 0 ? (
            <p className="text-sm text-ink-muted">No gear listed.</p>
          ) : (
            <ul className="flex flex-col gap-1.5 text-sm">
              {item.gear.map((g) => (
                <li key={g.id}>
                  <p className="font-medium">
                    {g.name} <span className="font-normal text-ink-muted">({SOURCE_TEXT[g.source]}{g.sponsored ? ', sponsored' : ''})</span>
                  </p>
                  {g.embargoText && (
                    <p className={g.slotBeforeEmbargo ? 'font-semibold text-danger' : 'text-ink-soft'}>
                      {g.slotBeforeEmbargo ? '✕ ' : ''}
                      {CALENDAR_EVENT_LABELS.embargo_lift} {g.embargoText}
                      {g.embargoInChannelZone && g.embargoZone !== channelZone ? ` (${g.embargoInChannelZone})` : ''}
                    </p>
                  )}
                  {g.dueBackOn && (
                    <p className={g.dueBackBeforeSlot ? 'text-warn' : 'text-ink-soft'}>
                      {g.dueBackBeforeSlot ? '⚠ ' : ''}Due back {g.dueBackOn}
                      {g.dueBackBeforeSlot ? ' — before the slot' : ''}
                    </p>
                  )}
                </li>
              ))}
            </ul>
          )}
        </section>

        <section aria-label="Footage">
          <h3 className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">Footage</h3>
          {item.footage === null ? (
            <p className="text-sm text-ink-muted">Footage tracking is not set up.</p>
          ) : item.footage.total === 0 ? (
            <p className="text-sm text-warn">⚠ No footage uploaded.</p>
          ) : (
            <p className="text-sm">
              {item.footage.total} files: {item.footage.verified} verified, {item.footage.received} received
              {item.footage.receiving ? `, ${item.footage.receiving} still uploading` : ''}
              {item.footage.flagged ? <span className="font-semibold text-danger">, {item.footage.flagged} flagged</span> : ''}
            </p>
          )}
        </section>

        <section aria-label="Description">
          <h3 className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">Description</h3>
          {!item.hasDescription && <p className="text-sm text-warn">⚠ No description draft saved.</p>}
          {item.descriptionWarnings.length === 0 ? (
            item.hasDescription && <p className="text-sm text-ok">✓ No warnings.</p>
          ) : (
            <ul className="list-disc pl-5 text-sm text-ink-soft">
              {item.descriptionWarnings.map((w, i) => (
                <li key={`${w.code}-${i}`}>{w.message.split('. ')[0]}</li>
              ))}
            </ul>
          )}
          <Link to={`/episodes/${episode.id}?tab=description`} className="mt-1 inline-block text-sm text-accent underline">
            Open the description
          </Link>
        </section>
      </div>

      {item.blockers.length > 0 && (
        <div className="mt-3 rounded-md border-l-4 border-danger bg-danger-soft p-3 text-sm" role="note" aria-label="What stops approval">
          <p className="font-semibold text-danger">Approval will be refused:</p>
          <ul className="list-disc pl-5">
            {item.blockers.map((b) => (
              <li key={b}>{b}</li>
            ))}
          </ul>
        </div>
      )}
      {slot?.status === 'proposed' && (
        <div className="mt-3">
          <DecisionForm slotId={slot.id} title={episode.title} blocked={item.blockers.length > 0} />
        </div>
      )}
    </article>
  );
}
