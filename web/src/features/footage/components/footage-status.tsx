import { FOOTAGE_STATE_LABELS, type Footage } from '@midgray/shared';

const STYLE: Record<Footage['status'], string> = {
  receiving: 'bg-accent-soft text-accent-strong border-accent/40',
  received: 'bg-paper text-ink-soft border-line-strong',
  verified: 'bg-ok-soft text-ok border-ok/40',
  flagged: 'bg-danger-soft text-danger border-danger/40',
};

/** A file's state as a small labelled badge (the word is always there; colour only helps). */
export function FootageStatusBadge({ f }: { f: Footage }) {
  const checking = f.status === 'received' && (!f.serverSha256 || (!f.probe && !f.probeError));
  const noBrowserSum = f.status === 'received' && !checking && !f.clientSha256;
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2 py-0.5 text-xs font-semibold ${STYLE[f.status]}`}>
      {f.status === 'receiving' ? `Receiving ${f.sizeBytes ? Math.floor((100 * f.receivedBytes) / f.sizeBytes) : 0} %` : FOOTAGE_STATE_LABELS[f.status]}
      {checking && <span className="font-normal">· checking</span>}
      {noBrowserSum && <span className="font-normal">· no browser checksum</span>}
    </span>
  );
}
