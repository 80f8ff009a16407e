// Everything Midgray knows about one file: the probe, both checksums, the spec-sheet comparison.
import { codecLabel, FILE_FORMAT_LABELS, type FileFormat, type Footage } from '@midgray/shared';
import { formatBytes, formatDuration } from './format.ts';

const row = (label: string, value: string | null | undefined) => (
  <div className="flex justify-between gap-3 border-b border-line py-1 last:border-0">
    <dt className="text-ink-muted">{label}</dt>
    <dd className="text-right font-medium text-ink">{value ?? '—'}</dd>
  </div>
);

export function FootageDetails({ f }: { f: Footage }) {
  const p = f.probe;
  const hashState =
    f.clientSha256 && f.serverSha256 ? (f.clientSha256 === f.serverSha256 ? 'match' : 'differ') : f.serverSha256 ? 'waiting for the browser' : f.status === 'receiving' ? 'after the upload' : 'computing';
  return (
    <div className="grid gap-4 p-3 md:grid-cols-[auto_minmax(0,1fr)_minmax(0,1fr)]">
      {f.hasThumbnail ? (
        <img src={`/api/footage/${f.id}/thumbnail`} alt={`First frame of ${f.originalName}`} className="max-h-40 w-auto rounded border border-line" loading="lazy" />
      ) : (
        <div className="hidden md:block" />
      )}
      <section aria-label="Probe">
        <h3 className="mb-1 text-sm font-semibold">Probe</h3>
        {f.probeError && <p className="mb-2 rounded border border-danger/40 bg-danger-soft p-2 text-sm text-danger">{f.probeError}</p>}
        {!p && !f.probeError && (
          <p className="text-sm text-ink-muted">{f.status === 'receiving' ? 'Read once the upload has finished.' : f.status === 'received' ? 'Reading the file…' : 'This file was not probed.'}</p>
        )}
        {p && (
          <dl className="text-sm">
            {row('Container', FILE_FORMAT_LABELS[f.format as FileFormat] ?? f.format)}
            {row('Codec', p.codec ? `${codecLabel(p.codec)}${p.profile ? ` (${p.profile})` : ''}` : null)}
            {row('Resolution', p.width && p.height ? `${p.width}×${p.height}` : null)}
            {row('Frame rate', p.frameRate ? `${Number(p.fps!.toFixed(3))} fps (${p.frameRate})` : null)}
            {row('Bit depth', p.bitDepth ? `${p.bitDepth}-bit` : null)}
            {row('Chroma subsampling', p.chromaSubsampling)}
            {row('Duration', p.durationSeconds != null ? formatDuration(p.durationSeconds) : null)}
            {row('Bitrate', p.bitrateBitsPerSecond ? `${(p.bitrateBitsPerSecond / 1e6).toFixed(1)} Mb/s` : null)}
            {row('Timecode', p.timecode)}
            {row('Size', formatBytes(f.sizeBytes))}
          </dl>
        )}
      </section>
      <section aria-label="Checks">
        <h3 className="mb-1 text-sm font-semibold">Checksums (SHA-256): {hashState}</h3>
        <dl className="text-xs">
          <dt className="text-ink-muted">Computed in the browser</dt>
          <dd className="mb-1 break-all font-mono">{f.clientSha256 ?? '—'}</dd>
          <dt className="text-ink-muted">Computed on the server</dt>
          <dd className="break-all font-mono">{f.serverSha256 ?? '—'}</dd>
        </dl>
        <h3 className="mb-1 mt-3 text-sm font-semibold">Spec sheet{f.specTestName ? ` of ${f.specTestName}` : ''}</h3>
        {f.specMismatches === null && !f.specSkipped.length && <p className="text-sm text-ink-muted">Not compared yet.</p>}
        {f.specMismatches && f.specMismatches.length === 0 && f.specTestName && <p className="text-sm text-ok">Every compared value matches.</p>}
        {f.specMismatches && f.specMismatches.length > 0 && (
          <ul className="space-y-1 text-sm">
            {f.specMismatches.map((m) => (
              <li key={m.key} className="rounded border border-danger/40 bg-danger-soft p-2 text-danger">
                <span className="font-semibold">{m.label}:</span> {m.difference}
              </li>
            ))}
          </ul>
        )}
        {f.specSkipped.length > 0 && (
          <details className="mt-2 text-xs text-ink-soft">
            <summary className="cursor-pointer">{f.specSkipped.length} line{f.specSkipped.length === 1 ? '' : 's'} not compared</summary>
            <ul className="mt-1 list-disc pl-4">
              {f.specSkipped.map((s) => (
                <li key={s.key}>
                  {s.label}: {s.reason}
                </li>
              ))}
            </ul>
          </details>
        )}
      </section>
    </div>
  );
}
