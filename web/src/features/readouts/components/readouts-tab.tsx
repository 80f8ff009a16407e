// The episode's Readouts tab: per test, the verdict (ceiling ISO or latitude window) with its
// threshold beside the host's own ratings, the charts, the table of steps with their figures and
// frames, the measuring region, and for brackets the reference/recovered frames.
import { lazy, Suspense, useState } from 'react';
import { Link } from 'react-router-dom';
import { mixedSettingsNote, TEST_KIND_LABELS, type ReadoutGrid, type StepReadoutsDto, type TestReadoutsDto } from '@midgray/shared';
import type { EpisodeTabProps } from '../../../app/episode-tabs.tsx';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { ErrorNote, Loading, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { readoutImagePath, readoutsCsvPath, stepFramePath, useEpisodeReadouts, useRunTestReadouts, useSaveReadoutRegion } from '../api/readouts.ts';
import { thresholdSource, verdictHeadline, verdictRule } from '../readout-format.ts';
import { DEFAULT_RUN_OPTIONS, runInput, type RunOptions } from '../run-options.ts';
import { RegionPicker } from './region-picker.tsx';
import { StepsTable } from './steps-table.tsx';
import { WipeView } from './wipe-view.tsx';

// recharts is heavy: the charts arrive in their own chunk, after the table.
const TestCharts = lazy(() => import('./charts.tsx').then((m) => ({ default: m.TestCharts })));

export default function ReadoutsTab({ episodeId }: EpisodeTabProps) {
  const readouts = useEpisodeReadouts(episodeId);
  const [selected, setSelected] = useState<string | null>(null);
  if (readouts.isLoading) return <Loading what="Loading readouts" />;
  if (readouts.error) return <ErrorNote error={readouts.error} />;
  const data = readouts.data!;
  if (!data.tests.length) {
    return <p className="text-sm text-ink-soft">No tests yet. Plan an ISO sweep or a latitude bracket on the Plan tab; once frames are uploaded for its steps, they can be measured here.</p>;
  }
  const current = data.tests.find((t) => t.test.id === selected) ?? data.tests[0];
  return (
    <div className="flex flex-col gap-4">
      {data.tests.length > 1 && (
        <div className="flex flex-wrap gap-2" role="group" aria-label="Tests">
          {data.tests.map((t) => (
            <button
              key={t.test.id}
              type="button"
              aria-pressed={t.test.id === current.test.id}
              onClick={() => setSelected(t.test.id)}
              className={`rounded-md border px-3 py-1.5 text-sm font-semibold ${t.test.id === current.test.id ? 'border-ink bg-ink text-white' : 'border-line-strong bg-card text-ink hover:bg-paper'}`}
            >
              {t.test.name}
              <span className={`ml-2 text-xs font-normal ${t.test.id === current.test.id ? 'text-white/80' : 'text-ink-muted'}`}>
                {t.verdict.stepsMeasured}/{t.verdict.stepsTotal} measured
              </span>
            </button>
          ))}
        </div>
      )}
      <TestReadouts key={current.test.id} test={current} episodeId={episodeId} />
    </div>
  );
}

function TestReadouts({ test, episodeId }: { test: TestReadoutsDto; episodeId: string }) {
  const toast = useToast();
  const run = useRunTestReadouts(episodeId);
  const [options, setOptions] = useState<RunOptions>(DEFAULT_RUN_OPTIONS);
  const pending = test.steps.filter((s) => s.pending).length;
  const withFrames = test.steps.filter((s) => s.frameSource).length;
  const hasVideo = test.steps.some((s) => s.frameSource?.isVideo);

  const runAll = () =>
    run.mutate(
      { testId: test.test.id, ...runInput(options, test.readoutKind) },
      {
        onSuccess: (r) =>
          toast({
            tone: 'success',
            title: `${r.queued.length} ${r.queued.length === 1 ? 'readout' : 'readouts'} queued`,
            lines: r.skipped.length ? [`Skipped ${r.skipped.map((s) => `${s.label} (${s.reason})`).join(', ')}`] : undefined,
          }),
        onError: (e) => toast({ tone: 'error', title: 'Readouts not started', lines: [e.message] }),
      },
    );

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 className="text-lg font-bold">{test.test.name}</h2>
          <p className="text-sm text-ink-soft">
            {TEST_KIND_LABELS[test.test.kind]} · {test.readoutKind === 'noise' ? 'noise readouts on the region' : 'recovery readouts against the 0-stop frame'} · {withFrames} of {test.steps.length} steps have a frame
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {test.canRun && (
            <Button variant="primary" onClick={runAll} disabled={run.isPending || withFrames === 0} title={withFrames === 0 ? 'Upload frames for the steps on the Footage tab first' : undefined}>
              {run.isPending ? 'Queuing…' : test.verdict.stepsMeasured ? 'Run readouts again' : 'Run readouts'}
            </Button>
          )}
          <a href={readoutsCsvPath(test.test.id)} download className="inline-flex min-h-9 items-center rounded-md border border-line-strong bg-card px-3 py-1.5 text-sm font-semibold hover:bg-paper">
            Export CSV
          </a>
          <Link to={`/compare?tests=${test.test.id}`} className="inline-flex min-h-9 items-center rounded-md border border-line-strong bg-card px-3 py-1.5 text-sm font-semibold hover:bg-paper">
            Compare…
          </Link>
        </div>
      </div>
      <p aria-live="polite" className="text-sm text-ink-soft empty:hidden">
        {pending > 0 ? `${pending} ${pending === 1 ? 'readout is' : 'readouts are'} queued or measuring; this page updates by itself.` : ''}
      </p>

      {test.canRun && <RunOptionsForm options={options} onChange={setOptions} kind={test.readoutKind} hasVideo={hasVideo} />}

      <VerdictPanel test={test} />

      {test.verdict.stepsMeasured > 0 && (
        <Panel title="Charts">
          <Suspense fallback={<Loading what="Drawing the charts" />}>
            <TestCharts test={test} />
          </Suspense>
        </Panel>
      )}

      <Panel title="Steps">
        <StepsTable test={test} episodeId={episodeId} options={options} />
      </Panel>

      <RegionPanel test={test} episodeId={episodeId} grid={options.grid} />

      {test.readoutKind === 'recovery' && <RecoveryFramesPanel test={test} />}
    </div>
  );
}

function VerdictPanel({ test }: { test: TestReadoutsDto }) {
  const v = test.verdict;
  const rated = test.steps.filter((s) => s.rating !== null);
  const good = rated.filter((s) => (s.rating ?? 0) >= 4).map((s) => s.label);
  return (
    <section aria-label="Verdict" className="grid gap-3 rounded-lg border border-line bg-paper p-4 md:grid-cols-[minmax(0,1.2fr)_minmax(0,1fr)]">
      <div className="flex flex-col gap-1">
        <p className="text-xs font-semibold tracking-wide text-ink-muted uppercase">Measured</p>
        <p className="text-2xl font-bold" data-testid="verdict-headline">
          {verdictHeadline(v)}
        </p>
        <p className="text-sm text-ink-soft">
          {verdictRule(v)}
          {v.stepsMeasured > 0 ? ` · ${v.stepsMeasured} of ${v.stepsTotal} steps measured` : ''}
        </p>
        <p className="text-xs text-ink-muted">
          Threshold: <strong className="font-semibold text-ink-soft">{v.kind === 'noise' ? `SNR ${v.thresholds.snrThresholdDb} dB` : `ΔE00 ${v.thresholds.deltaEThreshold}`}</strong>. {thresholdSource(v.kind, v.thresholds)}
        </p>
        {mixedSettingsNote(v.mixedSettings) && (
          <p className="rounded-md bg-warn-soft px-2 py-1 text-sm text-warn" role="note">
            {mixedSettingsNote(v.mixedSettings)}
          </p>
        )}
      </div>
      <div className="flex flex-col gap-1 border-t border-line pt-3 md:border-t-0 md:border-l md:pt-0 md:pl-4">
        <p className="text-xs font-semibold tracking-wide text-ink-muted uppercase">The host’s verdict</p>
        {rated.length ? (
          <>
            <p className="text-sm">
              {rated.length} of {test.steps.length} steps rated; rated 4 or 5: {good.length ? good.join(', ') : 'none'}.
            </p>
            <p className="text-xs text-ink-muted">Ratings and notes from the shoot sit beside each step below: the figures back the verdict, they do not replace it.</p>
          </>
        ) : (
          <p className="text-sm text-ink-soft">No ratings yet: the host rates each step on the Plan tab when marking it shot.</p>
        )}
      </div>
    </section>
  );
}

function RunOptionsForm({ options, onChange, kind, hasVideo }: { options: RunOptions; onChange: (o: RunOptions) => void; kind: TestReadoutsDto['readoutKind']; hasVideo: boolean }) {
  const grid = options.grid;
  const setGrid = (g: Partial<ReadoutGrid> | null) => onChange({ ...options, grid: g === null ? null : { cols: 6, rows: 4, patch: null, ...grid, ...g } });
  return (
    <details className="rounded-lg border border-line bg-card p-3">
      <summary className="cursor-pointer text-sm font-semibold">Measurement options</summary>
      <div className="mt-3 flex flex-wrap items-end gap-3">
        {kind === 'noise' && (
          <>
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={!!grid} onChange={(e) => setGrid(e.target.checked ? {} : null)} />
              Per-patch grid over the region (for a chart)
            </label>
            {grid && (
              <>
                <TextField label="Columns" type="number" min={1} max={24} value={grid.cols} onChange={(e) => setGrid({ cols: Math.max(1, Math.min(24, Number(e.target.value) || 1)), patch: null })} className="w-24" />
                <TextField label="Rows" type="number" min={1} max={24} value={grid.rows} onChange={(e) => setGrid({ rows: Math.max(1, Math.min(24, Number(e.target.value) || 1)), patch: null })} className="w-24" />
                <SelectField label="Headline patch" value={grid.patch ?? ''} onChange={(e) => setGrid({ patch: e.target.value === '' ? null : Number(e.target.value) })} className="w-48">
                  <option value="">Nearest mid grey (auto)</option>
                  {Array.from({ length: grid.cols * grid.rows }, (_, i) => (
                    <option key={i} value={i}>
                      Row {Math.floor(i / grid.cols) + 1}, column {(i % grid.cols) + 1}
                    </option>
                  ))}
                </SelectField>
              </>
            )}
          </>
        )}
        <SelectField label="Encoding of the frames" value={options.transfer} onChange={(e) => onChange({ ...options, transfer: e.target.value as RunOptions['transfer'] })} className="w-64">
          <option value="auto">By file type (stills sRGB, video BT.709)</option>
          <option value="srgb">sRGB (IEC 61966-2-1)</option>
          <option value="bt709">BT.709 (ITU-R BT.709-6)</option>
        </SelectField>
        {hasVideo && (
          <TextField label="Frame time in videos (s)" type="number" min={0} step="0.1" placeholder="middle" value={options.frameTimeSeconds} onChange={(e) => onChange({ ...options, frameTimeSeconds: e.target.value })} className="w-44" />
        )}
      </div>
    </details>
  );
}

/** The step whose frame the region is drawn on: the 0-stop step of a bracket, else the middle measured step. */
function pictureStep(test: TestReadoutsDto): StepReadoutsDto | null {
  const framed = test.steps.filter((s) => s.latest?.hasFrame || s.frameSource);
  if (!framed.length) return null;
  if (test.readoutKind === 'recovery') return framed.find((s) => s.offsetStops !== null && Math.abs(s.offsetStops) < 1e-6) ?? framed[0];
  return framed[Math.floor((framed.length - 1) / 2)];
}

function RegionPanel({ test, episodeId, grid }: { test: TestReadoutsDto; episodeId: string; grid: ReadoutGrid | null }) {
  const toast = useToast();
  const save = useSaveReadoutRegion(episodeId);
  const [stepId, setStepId] = useState<string | null>(null);
  const framed = test.steps.filter((s) => s.latest?.hasFrame || s.frameSource);
  const step = framed.find((s) => s.id === stepId) ?? pictureStep(test);
  return (
    <Panel title="Measuring region">
      {!step ? (
        <p className="text-sm text-ink-soft">No frame to draw on yet: once a step has a frame grab or footage, draw the region here. Until then every step is measured on the centre tenth of its frame.</p>
      ) : (
        <div className="flex flex-col gap-3">
          {framed.length > 1 && (
            <SelectField label="Draw on the frame of" value={step.id} onChange={(e) => setStepId(e.target.value)} className="w-64">
              {framed.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.label}
                </option>
              ))}
            </SelectField>
          )}
          <RegionPicker
            src={step.latest?.hasFrame ? readoutImagePath(step.latest.id, 'frame') : stepFramePath(step.id)}
            alt={`Frame of ${step.label}`}
            saved={test.test.readoutRegion}
            grid={test.readoutKind === 'noise' ? grid : null}
            canEdit={test.canRun}
            saving={save.isPending}
            onSave={(region) =>
              save.mutate(
                { testId: test.test.id, region },
                {
                  onSuccess: () => toast({ tone: 'success', title: region ? 'Region saved' : 'Back to the centre tenth', lines: ['Run the readouts again to measure on it.'] }),
                  onError: (e) => toast({ tone: 'error', title: 'Region not saved', lines: [e.message] }),
                },
              )
            }
          />
        </div>
      )}
    </Panel>
  );
}

function RecoveryFramesPanel({ test }: { test: TestReadoutsDto }) {
  const candidates = test.steps.filter((s) => s.latest?.hasReferenceFrame && s.latest.hasFrame);
  const [stepId, setStepId] = useState<string | null>(null);
  if (!candidates.length) return null;
  // Default: the measured step with the largest difference, where there is most to see.
  const worst = [...candidates].sort((a, b) => ((b.latest!.results as { meanDeltaE?: number }).meanDeltaE ?? 0) - ((a.latest!.results as { meanDeltaE?: number }).meanDeltaE ?? 0))[0];
  const step = candidates.find((s) => s.id === stepId) ?? worst;
  return (
    <Panel title="Reference and recovered frames">
      <div className="flex flex-col gap-3">
        <SelectField label="Step" value={step.id} onChange={(e) => setStepId(e.target.value)} className="w-64">
          {candidates.map((s) => (
            <option key={s.id} value={s.id}>
              {s.label}
            </option>
          ))}
        </SelectField>
        <WipeView key={step.latest!.id} readout={step.latest!} stepLabel={step.label} />
      </div>
    </Panel>
  );
}
