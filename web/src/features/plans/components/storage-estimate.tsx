import { useState } from 'react';
import { bytesForBitrate, formatBytesBoth, parseBitrateMbps, uploadSeconds, type TestDto } from '@midgray/shared';
import { TextField } from '../../../components/ui/field.tsx';
import { formatDuration } from '../plan-format.ts';

const LINK_KEY = 'midgray.linkMbps';

/** Storage of a test: the spec sheet's bitrate × planned seconds of every step, in GB and GiB, and the upload time at a link speed. */
export function StorageEstimate({ test }: { test: TestDto }) {
  const [link, setLink] = useState(() => localStorage.getItem(LINK_KEY) ?? '100');
  const bitrateLine = test.specLines.find((l) => l.key === 'bitrate');
  const mbps = bitrateLine ? parseBitrateMbps(bitrateLine.value) : null;
  const seconds = test.steps.reduce((sum, s) => sum + s.plannedSeconds, 0);
  const linkMbps = Number(link);
  const linkOk = link.trim() !== '' && Number.isFinite(linkMbps) && linkMbps > 0;
  const bytes = mbps !== null ? bytesForBitrate(mbps, seconds) : null;
  return (
    <div className="flex flex-col gap-3 text-sm">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        <dt className="text-ink-soft">Footage</dt>
        <dd className="tabular-nums">
          {test.steps.length} steps, {formatDuration(seconds)} in all
          {test.steps.every((s) => s.plannedSeconds === test.secondsPerStep) && <span className="text-ink-muted"> ({test.secondsPerStep} s each)</span>}
        </dd>
        <dt className="text-ink-soft">Bitrate</dt>
        <dd>{mbps !== null ? `${Number(mbps.toFixed(3))} Mb/s` : <span className="text-warn">Fill the Bitrate line of the spec sheet (e.g. “400 Mb/s”) to estimate storage.</span>}</dd>
        {bytes !== null && (
          <>
            <dt className="text-ink-soft">Size</dt>
            <dd className="font-semibold tabular-nums" data-testid="storage-size">
              {formatBytesBoth(bytes)}
            </dd>
          </>
        )}
      </dl>
      <div className="grid grid-cols-[minmax(0,10rem)_1fr] items-end gap-3">
        <TextField
          label="Link speed (Mb/s)"
          type="number"
          step="any"
          inputMode="decimal"
          value={link}
          error={linkOk ? undefined : 'Enter a link speed above 0 Mb/s'}
          onChange={(e) => {
            setLink(e.target.value);
            localStorage.setItem(LINK_KEY, e.target.value);
          }}
        />
        <p className="pb-2 tabular-nums" aria-live="polite">
          {bytes !== null && linkOk ? (
            <>
              Upload: <span className="font-semibold whitespace-nowrap">{formatDuration(uploadSeconds(bytes, linkMbps))}</span>
            </>
          ) : null}
        </p>
      </div>
      <p className="text-xs text-ink-muted">1 GB = 10⁹ bytes, 1 GiB = 2³⁰ bytes. Upload time assumes the link's full rate; real transfers run slower.</p>
    </div>
  );
}
