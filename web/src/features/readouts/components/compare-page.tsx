// The compare page: pick two or more tests of the same kind from any of the channel's episodes
// (two bodies, or one body before and after a firmware update) and see their curves on the same
// axes and their verdicts side by side. The picked tests live in the URL (?tests=a,b), so a
// comparison can be shared with the team.
import { lazy, Suspense, useMemo } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { mixedSettingsNote, TEST_KIND_LABELS, type CompareDto, type TestKind } from '@midgray/shared';
import { ErrorNote, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { useCurrentChannel } from '../../channels/current-channel.tsx';
import { useCompare, useComparableTests } from '../api/readouts.ts';
import { SERIES_COLOURS } from '../palette.ts';
import { formatDb, formatIso, formatNumber, formatStopsShort, thresholdSource, verdictHeadline, verdictRule } from '../readout-format.ts';

const CompareCharts = lazy(() => import('./charts.tsx').then((m) => ({ default: m.CompareCharts })));
const SWATCHES = SERIES_COLOURS;
const KIND_PLURAL: Record<TestKind, string> = { iso_sweep: 'ISO sweeps', latitude_bracket: 'Latitude brackets', custom: 'Custom tests' };

export function ComparePage() {
  const { channel } = useCurrentChannel();
  const channelId = channel?.id ?? '';
  const [params, setParams] = useSearchParams();
  const picked = useMemo(() => (params.get('tests') ?? '').split(',').filter(Boolean), [params]);
  const tests = useComparableTests(channelId);
  const byId = new Map((tests.data ?? []).map((t) => [t.id, t]));
  const kinds = [...new Set((tests.data ?? []).map((t) => t.kind))];
  const kind: TestKind | null = (params.get('kind') as TestKind | null) ?? byId.get(picked[0])?.kind ?? kinds[0] ?? null;
  const pickedOfKind = picked.filter((id) => byId.get(id)?.kind === kind);
  const compare = useCompare(channelId, pickedOfKind);

  const setPicked = (ids: string[], nextKind: TestKind | null = kind) => {
    const next = new URLSearchParams();
    if (nextKind) next.set('kind', nextKind);
    if (ids.length) next.set('tests', ids.join(','));
    setParams(next, { replace: true });
  };

  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Compare readouts"
        description="Pick two or more tests of the same kind — two bodies, or one body before and after a firmware update — to see their curves on the same axes and their verdicts side by side, measured against this channel’s thresholds."
      />
      {tests.isLoading && <Loading what="Loading the channel’s tests" />}
      {tests.error && <ErrorNote error={tests.error} />}
      {tests.data && !tests.data.length && <p className="text-sm text-ink-soft">No tests in this channel yet: plan one on an episode’s Plan tab.</p>}
      {tests.data && kind && (
        <Panel title="Tests">
          <div className="flex flex-col gap-3">
            <div className="flex flex-wrap gap-2" role="group" aria-label="Kind of test">
              {kinds.map((k) => (
                <button
                  key={k}
                  type="button"
                  aria-pressed={k === kind}
                  onClick={() => setPicked(picked.filter((id) => byId.get(id)?.kind === k), k)}
                  className={`rounded-md border px-3 py-1.5 text-sm font-semibold ${k === kind ? 'border-ink bg-ink text-white' : 'border-line-strong bg-card text-ink hover:bg-paper'}`}
                >
                  {KIND_PLURAL[k]}
                </button>
              ))}
            </div>
            <fieldset>
              <legend className="mb-2 text-sm text-ink-soft">{KIND_PLURAL[kind]} of the channel’s episodes (newest first)</legend>
              <ul className="flex flex-col gap-1.5">
                {tests.data
                  .filter((t) => t.kind === kind)
                  .map((t) => {
                    const checked = pickedOfKind.includes(t.id);
                    const index = pickedOfKind.indexOf(t.id);
                    return (
                      <li key={t.id}>
                        <label className="flex items-start gap-2 text-sm">
                          <input type="checkbox" className="mt-1" checked={checked} onChange={(e) => setPicked(e.target.checked ? [...pickedOfKind, t.id] : pickedOfKind.filter((id) => id !== t.id))} />
                          {checked && <span aria-hidden="true" className="mt-1.5 inline-block h-2.5 w-4 shrink-0 rounded-sm" style={{ background: SWATCHES[index % SWATCHES.length] }} />}
                          <span>
                            <span className="font-semibold">{t.name}</span> <span className="text-ink-soft">· {t.episodeTitle}</span>
                            <span className="block text-xs text-ink-muted">
                              {t.stepsMeasured} of {t.stepsTotal} steps measured
                            </span>
                          </span>
                        </label>
                      </li>
                    );
                  })}
              </ul>
            </fieldset>
          </div>
        </Panel>
      )}
      {pickedOfKind.length < 2 && tests.data?.length ? <p className="text-sm text-ink-soft">Pick at least two tests to compare.</p> : null}
      {compare.error && <ErrorNote error={compare.error} />}
      {compare.isLoading && <Loading what="Comparing" />}
      {compare.data && pickedOfKind.length >= 2 && <Comparison data={compare.data} />}
    </div>
  );
}

function Comparison({ data }: { data: CompareDto }) {
  const noise = data.readoutKind === 'noise';
  const xs = [...new Set(data.series.flatMap((s) => s.points.map((p) => (noise ? p.iso : p.offsetStops)).filter((v): v is number => v !== null)))].sort((a, b) => a - b);
  return (
    <>
      <section aria-label="Verdicts" className="grid gap-3 sm:grid-cols-2 xl:grid-cols-4">
        {data.series.map((s, i) => (
          <article key={s.test.id} className="flex flex-col gap-1 rounded-lg border border-line bg-card p-4" style={{ borderTop: `4px solid ${SWATCHES[i % SWATCHES.length]}` }}>
            <h2 className="text-sm font-semibold">
              <Link to={`/episodes/${s.test.episodeId}?tab=readouts`} className="hover:underline">
                {s.test.episodeTitle}
              </Link>
            </h2>
            <p className="text-xs text-ink-muted">{s.test.name}</p>
            <p className="mt-1 text-lg font-bold">{verdictHeadline(s.verdict)}</p>
            <p className="text-xs text-ink-soft">
              {s.verdict.stepsMeasured} of {s.verdict.stepsTotal} steps measured
            </p>
            {mixedSettingsNote(s.verdict.mixedSettings) && (
              <p className="mt-1 text-xs text-warn" role="note">
                {mixedSettingsNote(s.verdict.mixedSettings)}
              </p>
            )}
          </article>
        ))}
      </section>
      <p className="text-sm text-ink-soft">
        {verdictRule({ ...data.series[0].verdict })}. {thresholdSource(data.readoutKind, data.thresholds)}
      </p>
      <Panel title="Curves">
        <Suspense fallback={<Loading what="Drawing the charts" />}>
          <CompareCharts compare={data} />
        </Suspense>
      </Panel>
      <Panel title={noise ? 'SNR per ISO' : 'Mean ΔE00 per offset'}>
        <div className="-mx-4 overflow-x-auto px-4">
          <table className="w-full text-sm">
            <caption className="sr-only">{noise ? 'SNR in dB of each test per ISO step' : 'Mean ΔE00 of each test per stop offset'}</caption>
            <thead className="bg-paper text-ink-soft">
              <tr>
                <th scope="col" className="px-2 py-2 text-left font-semibold">
                  {TEST_KIND_LABELS[data.series[0].test.kind]}
                </th>
                {xs.map((x) => (
                  <th key={x} scope="col" className="px-2 py-2 text-right font-semibold whitespace-nowrap">
                    {noise ? formatIso(x) : formatStopsShort(x)}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {data.series.map((s) => (
                <tr key={s.test.id} className="border-t border-line">
                  <th scope="row" className="px-2 py-2 text-left font-semibold">
                    {s.test.episodeTitle}
                    <span className="block text-xs font-normal text-ink-muted">{s.test.name}</span>
                  </th>
                  {xs.map((x) => {
                    const p = s.points.find((q) => (noise ? q.iso === x : q.offsetStops !== null && Math.abs(q.offsetStops - x) < 1e-6));
                    return (
                      <td key={x} className="px-2 py-2 text-right tabular-nums whitespace-nowrap">
                        {noise ? formatDb(p?.snrDb) : formatNumber(p?.meanDeltaE, 2)}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Panel>
    </>
  );
}
