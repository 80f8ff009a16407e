// The table of a test's steps: frame thumbnail, the latest readout's figures (with pass/fail
// against the threshold in words, not colour alone), the host's rating and notes, and the
// readout's state, re-run and history.
import { READOUT_STATE_LABELS, type NoiseResults, type ReadoutDto, type RecoveryResults, type StepReadoutsDto, type TestReadoutsDto } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { readoutImagePath, useRunStepReadout } from '../api/readouts.ts';
import { formatDb, formatNumber, formatPercent, formatStops } from '../readout-format.ts';
import { runInput, type RunOptions } from '../run-options.ts';

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

function Badge({ ok, yes, no }: { ok: boolean; yes: string; no: string }) {
  return <span className={`ml-1.5 rounded px-1.5 py-0.5 text-xs font-semibold ${ok ? 'bg-ok-soft text-ok' : 'bg-danger-soft text-danger'}`}>{ok ? yes : no}</span>;
}

function Thumb({ step }: { step: StepReadoutsDto }) {
  if (step.latest?.hasFrame) {
    return <img src={readoutImagePath(step.latest.id, 'frame')} alt={`Measured frame of ${step.label}`} loading="lazy" className="h-12 w-20 rounded border border-line bg-ink object-cover" />;
  }
  return <span className="inline-flex h-12 w-20 items-center justify-center rounded border border-dashed border-line-strong text-center text-[11px] leading-tight text-ink-muted">{step.frameSource ? 'not measured' : 'no frame'}</span>;
}

/** One line of a readout's parameters: region, grid, encoding, frame time. */
export function paramsLine(r: ReadoutDto): string {
  const p = r.params;
  const parts = [p.region ? `region ${(p.region.w * 100).toFixed(1)} × ${(p.region.h * 100).toFixed(1)} % at ${(p.region.x * 100).toFixed(1)}, ${(p.region.y * 100).toFixed(1)} %` : 'centre tenth'];
  if (p.grid) parts.push(`grid ${p.grid.cols} × ${p.grid.rows}`);
  parts.push(p.transfer === 'srgb' ? 'sRGB' : 'BT.709');
  if (p.frameTimeSeconds !== null) parts.push(`at ${p.frameTimeSeconds.toFixed(2)} s`);
  if (p.stride) parts.push(`every ${p.stride}th pixel`);
  return parts.join(' · ');
}

function History({ step }: { step: StepReadoutsDto }) {
  if (!step.history.length) return null;
  return (
    <details className="mt-1 text-xs">
      <summary className="cursor-pointer text-ink-soft">History ({step.history.length})</summary>
      <ol className="mt-1 flex flex-col gap-1.5">
        {step.history.map((r) => (
          <li key={r.id} className="rounded border border-line bg-paper p-1.5">
            <span className="font-semibold">{READOUT_STATE_LABELS[r.status]}</span> · {when(r.createdAt)}
            {r.requestedBy ? ` · ${r.requestedBy.name}` : ''}
            {r.id === step.latest?.id ? ' · shown' : ''}
            <br />
            <span className="text-ink-muted">
              {r.footageName ?? 'file deleted'} · {paramsLine(r)}
            </span>
            {r.results?.kind === 'noise' && <span> · SNR {formatDb(r.results.snrDb)}</span>}
            {r.results?.kind === 'recovery' && <span> · mean ΔE00 {formatNumber(r.results.meanDeltaE)}</span>}
            {r.error && <span className="block text-danger">{r.error}</span>}
            <span className="block text-ink-muted">{r.softwareVersion}</span>
          </li>
        ))}
      </ol>
    </details>
  );
}

function HostCell({ step }: { step: StepReadoutsDto }) {
  return (
    <td className="max-w-[16rem] px-2 py-2 align-top">
      {step.rating !== null ? <span className="font-semibold">{step.rating}/5</span> : <span className="text-ink-muted">not rated</span>}
      {step.observation && <span className="mt-0.5 block text-xs text-ink-soft">{step.observation}</span>}
    </td>
  );
}

function ReadoutInfo({ step, test, episodeId, options }: { step: StepReadoutsDto; test: TestReadoutsDto; episodeId: string; options: RunOptions }) {
  const rerun = useRunStepReadout(episodeId);
  const toast = useToast();
  const newest = step.history[0];
  return (
    <>
      {step.pending ? (
        <span className="font-semibold text-warn">{READOUT_STATE_LABELS[step.pending.status]}…</span>
      ) : newest?.status === 'failed' ? (
        <span className="block text-xs text-danger" role="note">
          Last run failed: {newest.error}
        </span>
      ) : step.latest ? (
        <span className="text-xs text-ink-soft">{when(step.latest.finishedAt ?? step.latest.createdAt)}</span>
      ) : (
        <span className="text-xs text-ink-muted">{step.frameSource ? `Frame: ${step.frameSource.originalName}` : 'Upload a frame on the Footage tab'}</span>
      )}
      {test.canRun && step.frameSource && (
        <Button
          variant="ghost"
          className="mt-1 !min-h-7 !px-2 !py-0.5 text-xs"
          disabled={!!step.pending || rerun.isPending}
          aria-label={`Run the readout of ${step.label} again`}
          onClick={() =>
            rerun.mutate(
              { stepId: step.id, ...runInput(options, test.readoutKind) },
              { onError: (e) => toast({ tone: 'error', title: `${step.label}: readout not started`, lines: [e.message] }) },
            )
          }
        >
          {step.latest ? 'Run again' : 'Run'}
        </Button>
      )}
      <History step={step} />
    </>
  );
}

const th = 'px-2 py-2 text-left font-semibold';
const num = 'px-2 py-2 text-right align-top tabular-nums whitespace-nowrap';

export function StepsTable({ test, episodeId, options }: { test: TestReadoutsDto; episodeId: string; options: RunOptions }) {
  const noise = test.readoutKind === 'noise';
  const { snrThresholdDb, deltaEThreshold } = test.thresholds;
  return (
    <>
      <StepCards test={test} episodeId={episodeId} options={options} />
      <div className="-mx-4 hidden overflow-x-auto px-4 md:block">
        <table className="w-full min-w-[980px] text-sm">
          <caption className="sr-only">
            {noise ? `Noise readouts per ISO step; threshold SNR ${snrThresholdDb} dB` : `Recovery readouts per stop offset; threshold mean ΔE00 ${deltaEThreshold}`}
          </caption>
          <thead className="bg-paper text-ink-soft">
            <tr>
              <th scope="col" className={th}>Step</th>
              <th scope="col" className={th}>Frame</th>
              {noise ? (
                <>
                  <th scope="col" className={`${th} text-right`}>SNR</th>
                  <th scope="col" className={`${th} text-right`} title="Standard deviation of linear luma on the region">σ luma</th>
                  <th scope="col" className={`${th} text-right`} title="√(σa*² + σb*²), CIELAB units">Chroma noise</th>
                  <th scope="col" className={`${th} text-right`} title="Mean a* and b*: +a* magenta, −a* green, +b* yellow, −b* blue">Cast a*, b*</th>
                </>
              ) : (
                <>
                  <th scope="col" className={`${th} text-right`}>Mean ΔE00</th>
                  <th scope="col" className={`${th} text-right`}>p95 / max</th>
                  <th scope="col" className={`${th} text-right`} title="Noise on the region against the reference: log2 of the σ ratio">Noise vs ref.</th>
                </>
              )}
              <th scope="col" className={`${th} text-right`}>Clipped</th>
              <th scope="col" className={`${th} text-right`}>Crushed</th>
              <th scope="col" className={th}>Host’s rating and notes</th>
              <th scope="col" className={th}>Readout</th>
            </tr>
          </thead>
          <tbody>
            {test.steps.map((s) => {
              const r = s.latest?.results ?? null;
              const n = r?.kind === 'noise' ? (r as NoiseResults) : null;
              const rec = r?.kind === 'recovery' ? (r as RecoveryResults) : null;
              return (
                <tr key={s.id} className="border-t border-line">
                  <th scope="row" className="px-2 py-2 text-left align-top font-semibold whitespace-nowrap">
                    {s.label}
                    {!noise && s.offsetStops !== null && Math.abs(s.offsetStops) < 1e-6 && <span className="block text-xs font-normal text-ink-muted">reference</span>}
                    {noise && s.offsetStops !== null && s.offsetStops !== 0 && <span className="block text-xs font-normal text-ink-muted">{formatStops(s.offsetStops)}</span>}
                  </th>
                  <td className="px-2 py-2 align-top">
                    <Thumb step={s} />
                  </td>
                  {noise ? (
                    <>
                      <td className={num}>
                        {formatDb(n?.snrDb)}
                        {n && <Badge ok={n.snrDb !== null && n.snrDb >= snrThresholdDb} yes="meets" no="below" />}
                        {n?.headline === 'patch' && <span className="block text-xs text-ink-muted">patch {n.patchIndex! + 1} of {n.grid?.patches.length}</span>}
                      </td>
                      <td className={num}>{formatNumber(n?.sigmaLinearLuma, 5)}</td>
                      <td className={num}>{formatNumber(n?.chromaNoise, 2)}</td>
                      <td className={num}>{n ? `${formatNumber(n.meanA, 2)}, ${formatNumber(n.meanB, 2)}` : '—'}</td>
                    </>
                  ) : (
                    <>
                      <td className={num}>
                        {formatNumber(rec?.meanDeltaE, 2)}
                        {rec && <Badge ok={rec.meanDeltaE <= deltaEThreshold} yes="within" no="over" />}
                      </td>
                      <td className={num}>{rec ? `${formatNumber(rec.p95DeltaE, 2)} / ${formatNumber(rec.maxDeltaE, 1)}` : '—'}</td>
                      <td className={num}>{rec?.noiseStops === null || rec?.noiseStops === undefined ? '—' : `${rec.noiseStops >= 0 ? '+' : ''}${formatNumber(rec.noiseStops, 2)} st.`}</td>
                    </>
                  )}
                  <td className={num}>{formatPercent(r?.clippedFraction)}</td>
                  <td className={num}>{formatPercent(r?.crushedFraction)}</td>
                  <HostCell step={s} />
                  <td className="min-w-[11rem] px-2 py-2 align-top">
                    <ReadoutInfo step={s} test={test} episodeId={episodeId} options={options} />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </>
  );
}

/** Phones: one card per step with the same figures, the host's verdict and the readout actions. */
function StepCards({ test, episodeId, options }: { test: TestReadoutsDto; episodeId: string; options: RunOptions }) {
  const noise = test.readoutKind === 'noise';
  const { snrThresholdDb, deltaEThreshold } = test.thresholds;
  return (
    <ul className="flex flex-col gap-3 md:hidden" aria-label="Steps">
      {test.steps.map((s) => {
        const r = s.latest?.results ?? null;
        const n = r?.kind === 'noise' ? (r as NoiseResults) : null;
        const rec = r?.kind === 'recovery' ? (r as RecoveryResults) : null;
        const figures: [string, string][] = noise
          ? [
              ['σ luma', formatNumber(n?.sigmaLinearLuma, 5)],
              ['Chroma noise', formatNumber(n?.chromaNoise, 2)],
              ['Cast a*, b*', n ? `${formatNumber(n.meanA, 2)}, ${formatNumber(n.meanB, 2)}` : '—'],
            ]
          : [
              ['p95 / max', rec ? `${formatNumber(rec.p95DeltaE, 2)} / ${formatNumber(rec.maxDeltaE, 1)}` : '—'],
              ['Noise vs ref.', rec?.noiseStops === null || rec?.noiseStops === undefined ? '—' : `${rec.noiseStops >= 0 ? '+' : ''}${formatNumber(rec.noiseStops, 2)} stops`],
            ];
        figures.push(['Clipped', formatPercent(r?.clippedFraction)], ['Crushed', formatPercent(r?.crushedFraction)]);
        return (
          <li key={s.id} className="rounded-md border border-line p-3">
            <div className="flex items-start gap-3">
              <Thumb step={s} />
              <div className="min-w-0 flex-1">
                <p className="font-semibold">{s.label}</p>
                <p className="text-sm">
                  {noise ? (
                    <>
                      SNR {formatDb(n?.snrDb)}
                      {n && <Badge ok={n.snrDb !== null && n.snrDb >= snrThresholdDb} yes="meets" no="below" />}
                    </>
                  ) : (
                    <>
                      Mean ΔE00 {formatNumber(rec?.meanDeltaE, 2)}
                      {rec && <Badge ok={rec.meanDeltaE <= deltaEThreshold} yes="within" no="over" />}
                    </>
                  )}
                </p>
              </div>
            </div>
            <dl className="mt-2 grid grid-cols-2 gap-x-3 gap-y-0.5 text-xs">
              {figures.map(([k, v]) => (
                <div key={k} className="contents">
                  <dt className="text-ink-muted">{k}</dt>
                  <dd className="text-right tabular-nums">{v}</dd>
                </div>
              ))}
            </dl>
            <p className="mt-2 text-xs">
              <span className="text-ink-muted">Host: </span>
              {s.rating !== null ? <span className="font-semibold">{s.rating}/5</span> : 'not rated'}
              {s.observation && <span className="text-ink-soft"> · {s.observation}</span>}
            </p>
            <div className="mt-1">
              <ReadoutInfo step={s} test={test} episodeId={episodeId} options={options} />
            </div>
          </li>
        );
      })}
    </ul>
  );
}
