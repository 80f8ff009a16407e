import { formatInstantWithZoneName, type PublishSlot, type SlotStatus } from '@midgray/shared';

/** Status words with a symbol, so proposed / approved / rejected never rely on colour alone. */
export const SLOT_STATUS_TEXT: Record<SlotStatus, { label: string; symbol: string; tone: string }> = {
  proposed: { label: 'Proposed', symbol: '◌', tone: 'border-warn bg-warn-soft text-warn' },
  approved: { label: 'Approved', symbol: '✓', tone: 'border-ok bg-ok-soft text-ok' },
  rejected: { label: 'Rejected', symbol: '✕', tone: 'border-danger bg-danger-soft text-danger' },
  superseded: { label: 'Replaced', symbol: '↺', tone: 'border-line-strong bg-paper text-ink-soft' },
};

/** A small status badge: symbol, word and colour. */
export function SlotStatusBadge({ status }: { status: SlotStatus }) {
  const s = SLOT_STATUS_TEXT[status];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-semibold ${s.tone}`}>
      <span aria-hidden="true">{s.symbol}</span>
      {s.label}
    </span>
  );
}

/** The slot's instant in the zones that matter: the one it was proposed in, the channel's, the viewer's. */
export function SlotTimes({ slot, channelZone, viewerZone }: { slot: Pick<PublishSlot, 'startsAt' | 'zone'>; channelZone: string; viewerZone: string }) {
  const rows = [
    { label: 'Proposed as', zone: slot.zone },
    { label: 'Channel time', zone: channelZone },
    { label: 'Your time', zone: viewerZone },
  ].filter((r, i, all) => all.findIndex((o) => o.zone === r.zone) === i);
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
      {rows.map((r) => (
        <div key={r.label} className="contents">
          <dt className="text-ink-muted">{r.label}</dt>
          <dd className="font-medium tabular-nums">{formatInstantWithZoneName(slot.startsAt, r.zone)}</dd>
        </div>
      ))}
    </dl>
  );
}
