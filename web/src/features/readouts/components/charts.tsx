// The readout charts (recharts, loaded lazily: this module and the library stay out of the first
// page). ISO runs along a log2 axis so every stop is the same width; offsets are linear in stops.
import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { CompareDto, CurvePoint, TestReadoutsDto } from '@midgray/shared';
import { SERIES_COLOURS } from '../palette.ts';
import { formatNumber, formatStopsShort, isoToX, xToIso } from '../readout-format.ts';


interface LineSpec {
  key: string;
  name: string;
  colour: string;
  dashed?: boolean;
}

interface CurveChartProps {
  title: string;
  /** What the chart shows, for people who cannot see it (the table holds every value too). */
  summary: string;
  rows: Array<Record<string, number | null>>;
  axis: 'iso' | 'stops';
  xTicks: number[];
  yLabel: string;
  yUnit?: string;
  lines: LineSpec[];
  threshold?: { value: number; label: string };
  digits?: number;
}

/** One chart in a figure with its caption; x is log2(ISO) or stops. */
function CurveChart({ title, summary, rows, axis, xTicks, yLabel, yUnit = '', lines, threshold, digits = 1 }: CurveChartProps) {
  const formatX = (x: number) => (axis === 'iso' ? String(xToIso(x)) : formatStopsShort(x));
  return (
    <figure className="flex min-w-0 flex-col gap-1">
      <figcaption className="text-sm font-semibold">
        {title}
        {threshold && (
          <span className="ml-2 inline-flex items-center gap-1 text-xs font-normal text-danger">
            <span aria-hidden="true" className="inline-block w-5 border-t-2 border-dashed border-danger" />
            {threshold.label}
          </span>
        )}
      </figcaption>
      {lines.length > 1 && (
        // An HTML legend wraps on narrow screens instead of covering the plot.
        <ul className="flex flex-wrap gap-x-4 gap-y-0.5 text-xs text-ink-soft" aria-hidden="true">
          {lines.map((l) => (
            <li key={l.key} className="inline-flex items-center gap-1.5">
              <span className="inline-block w-5 border-t-2" style={{ borderColor: l.colour, borderTopStyle: l.dashed ? 'dashed' : 'solid' }} />
              {l.name}
            </li>
          ))}
        </ul>
      )}
      <div role="img" aria-label={`${title}. ${summary}${lines.length > 1 ? ` Lines: ${lines.map((l) => l.name).join('; ')}.` : ''}`} className="h-60 w-full min-w-0">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={rows} margin={{ top: 8, right: 12, bottom: 18, left: 4 }}>
            <CartesianGrid stroke="#e4e4e0" />
            <XAxis
              dataKey="x"
              type="number"
              domain={['dataMin', 'dataMax']}
              ticks={xTicks}
              tickFormatter={formatX}
              tick={{ fontSize: 11, fill: '#4a4a46' }}
              interval="preserveStartEnd"
              minTickGap={6}
              label={{ value: axis === 'iso' ? 'ISO (log₂ scale: one stop per step)' : 'Stop offset from the reference', position: 'insideBottom', offset: -10, fontSize: 11, fill: '#5f5f5a' }}
            />
            <YAxis tick={{ fontSize: 11, fill: '#4a4a46' }} width={44} label={{ value: yLabel, angle: -90, position: 'insideLeft', fontSize: 11, fill: '#5f5f5a', dy: 40 }} />
            <Tooltip
              labelFormatter={(x) => (axis === 'iso' ? `ISO ${xToIso(Number(x))}` : `${formatStopsShort(Number(x))} stops`)}
              formatter={(value, name) => [value === null || value === undefined ? '—' : `${formatNumber(Number(value), digits)}${yUnit}`, name]}
            />
            {threshold && <ReferenceLine y={threshold.value} stroke="#a3221b" strokeDasharray="5 4" ifOverflow="extendDomain" />}
            {lines.map((l) => (
              <Line key={l.key} dataKey={l.key} name={l.name} stroke={l.colour} strokeWidth={2} strokeDasharray={l.dashed ? '6 4' : undefined} dot={{ r: 3 }} connectNulls isAnimationActive={false} />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}

const measured = (t: TestReadoutsDto) => t.steps.filter((s) => s.latest?.results);

/** The charts of one test on the Readouts tab. */
export function TestCharts({ test }: { test: TestReadoutsDto }) {
  const steps = measured(test);
  if (!steps.length) return null;
  const { snrThresholdDb, deltaEThreshold } = test.thresholds;
  if (test.readoutKind === 'noise') {
    const rows = steps
      .filter((s) => s.iso)
      .map((s) => {
        const r = s.latest!.results!;
        return r.kind === 'noise' ? { x: isoToX(s.iso!), snr: r.snrDb, chromaA: r.chromaSigmaA, chromaB: r.chromaSigmaB, chroma: r.chromaNoise } : { x: isoToX(s.iso!), snr: null, chromaA: null, chromaB: null, chroma: null };
      })
      .sort((a, b) => a.x - b.x);
    const ticks = rows.map((r) => r.x);
    return (
      <div className="grid gap-4 lg:grid-cols-2">
        <CurveChart
          title="SNR against ISO"
          summary={`Signal-to-noise ratio of linear luma on the region, in dB, for ${rows.length} ISO steps; the dashed line is the ${snrThresholdDb} dB threshold.`}
          rows={rows}
          axis="iso"
          xTicks={ticks}
          yLabel="SNR (dB)"
          yUnit=" dB"
          lines={[{ key: 'snr', name: 'SNR', colour: SERIES_COLOURS[0] }]}
          threshold={{ value: snrThresholdDb, label: `threshold ${snrThresholdDb} dB` }}
        />
        <CurveChart
          title="Chroma noise against ISO"
          summary="Standard deviation of a* and of b* on the region (CIELAB units), and their combination, per ISO step."
          rows={rows}
          axis="iso"
          xTicks={ticks}
          yLabel="σ (CIELAB)"
          digits={2}
          lines={[
            { key: 'chroma', name: '√(σa*² + σb*²)', colour: SERIES_COLOURS[0] },
            { key: 'chromaA', name: 'σ a*', colour: SERIES_COLOURS[1], dashed: true },
            { key: 'chromaB', name: 'σ b*', colour: SERIES_COLOURS[2], dashed: true },
          ]}
        />
      </div>
    );
  }
  const rows = steps
    .filter((s) => s.offsetStops !== null)
    .map((s) => {
      const r = s.latest!.results!;
      return r.kind === 'recovery'
        ? { x: s.offsetStops!, mean: r.meanDeltaE, p95: r.p95DeltaE, clipped: r.clippedFraction * 100, crushed: r.crushedFraction * 100 }
        : { x: s.offsetStops!, mean: null, p95: null, clipped: null, crushed: null };
    })
    .sort((a, b) => a.x - b.x);
  const ticks = rows.map((r) => r.x);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <CurveChart
        title="ΔE00 against stop offset"
        summary={`Mean and 95th-percentile CIEDE2000 of each recovered frame against the 0-stop frame; the dashed line is the ${deltaEThreshold} threshold.`}
        rows={rows}
        axis="stops"
        xTicks={ticks}
        yLabel="ΔE00"
        digits={2}
        lines={[
          { key: 'mean', name: 'mean ΔE00', colour: SERIES_COLOURS[0] },
          { key: 'p95', name: '95th percentile', colour: SERIES_COLOURS[1], dashed: true },
        ]}
        threshold={{ value: deltaEThreshold, label: `threshold ${deltaEThreshold}` }}
      />
      <CurveChart
        title="Clipped and crushed against stop offset"
        summary="Share of pixels of each recovered frame with a channel at full scale (clipped) or luma at the floor (crushed), in percent."
        rows={rows}
        axis="stops"
        xTicks={ticks}
        yLabel="pixels (%)"
        yUnit=" %"
        digits={2}
        lines={[
          { key: 'clipped', name: 'clipped', colour: SERIES_COLOURS[0] },
          { key: 'crushed', name: 'crushed', colour: SERIES_COLOURS[1], dashed: true },
        ]}
      />
    </div>
  );
}

/** Rows for a compare chart: one row per x, one column per test (null where a test has no point). */
function mergeSeries(cmp: CompareDto, xOf: (p: CurvePoint) => number | null, yOf: (p: CurvePoint) => number | null) {
  const byX = new Map<number, Record<string, number | null>>();
  cmp.series.forEach((s, i) => {
    for (const p of s.points) {
      const x = xOf(p);
      const y = yOf(p);
      if (x === null || y === null) continue;
      const key = Math.round(x * 1e6) / 1e6;
      const row = byX.get(key) ?? { x: key };
      row[`s${i}`] = y;
      byX.set(key, row);
    }
  });
  return [...byX.values()].sort((a, b) => a.x! - b.x!);
}

/** The compare page's charts: every picked test's curve on the same axes. */
export function CompareCharts({ compare }: { compare: CompareDto }) {
  const lines = compare.series.map((s, i) => ({ key: `s${i}`, name: `${s.test.episodeTitle} — ${s.test.name}`, colour: SERIES_COLOURS[i % SERIES_COLOURS.length], dashed: i >= SERIES_COLOURS.length }));
  const { snrThresholdDb, deltaEThreshold } = compare.thresholds;
  if (compare.readoutKind === 'noise') {
    const isoX = (p: CurvePoint) => (p.iso ? isoToX(p.iso) : null);
    const snr = mergeSeries(compare, isoX, (p) => p.snrDb);
    const chroma = mergeSeries(compare, isoX, (p) => p.chromaNoise);
    return (
      <div className="grid gap-4 lg:grid-cols-2">
        <CurveChart title="SNR against ISO" summary={`SNR of each test per ISO step; the dashed line is the ${snrThresholdDb} dB threshold.`} rows={snr} axis="iso" xTicks={snr.map((r) => r.x!)} yLabel="SNR (dB)" yUnit=" dB" lines={lines} threshold={{ value: snrThresholdDb, label: `threshold ${snrThresholdDb} dB` }} />
        <CurveChart title="Chroma noise against ISO" summary="√(σa*² + σb*²) of each test per ISO step, CIELAB units." rows={chroma} axis="iso" xTicks={chroma.map((r) => r.x!)} yLabel="σ (CIELAB)" digits={2} lines={lines} />
      </div>
    );
  }
  const offX = (p: CurvePoint) => p.offsetStops;
  const de = mergeSeries(compare, offX, (p) => p.meanDeltaE);
  const clipped = mergeSeries(compare, offX, (p) => (p.clippedFraction === null || p.crushedFraction === null ? null : (p.clippedFraction + p.crushedFraction) * 100));
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <CurveChart title="Mean ΔE00 against stop offset" summary={`Mean CIEDE2000 against each test's 0-stop frame; the dashed line is the ${deltaEThreshold} threshold.`} rows={de} axis="stops" xTicks={de.map((r) => r.x!)} yLabel="ΔE00" digits={2} lines={lines} threshold={{ value: deltaEThreshold, label: `threshold ${deltaEThreshold}` }} />
      <CurveChart title="Clipped + crushed against stop offset" summary="Share of pixels clipped or crushed in each recovered frame, in percent." rows={clipped} axis="stops" xTicks={clipped.map((r) => r.x!)} yLabel="pixels (%)" yUnit=" %" digits={2} lines={lines} />
    </div>
  );
}
