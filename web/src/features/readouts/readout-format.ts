// How readout figures read on screen: units always beside the number, stops with a true minus,
// thresholds with where their default comes from.
import { DEFAULT_THRESHOLDS, type ReadoutThresholds, type ReadoutVerdict } from './thresholds.ts';

const MINUS = '\u2212';

/** "23.4 dB", or "—" when there is no finite figure. */
export function formatDb(db: number | null | undefined): string {
  return db === null || db === undefined || !Number.isFinite(db) ? '—' : `${db.toFixed(1)} dB`;
}

/** A number with `digits` decimals and a true minus sign; "—" when missing. */
export function formatNumber(v: number | null | undefined, digits = 2): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  const text = Math.abs(v).toFixed(digits);
  return v < 0 && Number(text) !== 0 ? `${MINUS}${text}` : text;
}

/** A fraction 0…1 as a percentage: "0 %", "0.03 %", "12.5 %". */
export function formatPercent(fraction: number | null | undefined): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return '—';
  const pct = fraction * 100;
  if (pct === 0) return '0 %';
  return `${pct >= 10 ? pct.toFixed(1) : pct >= 0.1 ? pct.toFixed(2) : pct.toFixed(3)} %`;
}

/** A stop offset: "+2 stops", "−1 stop", "0 stops", thirds as "+⅓"-free decimals ("+0.33 stops"). */
export function formatStops(stops: number | null | undefined): string {
  if (stops === null || stops === undefined || !Number.isFinite(stops)) return '—';
  if (Math.abs(stops) < 1e-6) return '0 stops';
  const rounded = Math.round(stops * 100) / 100;
  const abs = Math.abs(rounded);
  return `${rounded > 0 ? '+' : MINUS}${abs} ${abs === 1 ? 'stop' : 'stops'}`;
}

/** Short axis label of a stop offset: "+2", "−1", "0". */
export function formatStopsShort(stops: number): string {
  if (Math.abs(stops) < 1e-6) return '0';
  const rounded = Math.round(stops * 100) / 100;
  return `${rounded > 0 ? '+' : MINUS}${Math.abs(rounded)}`;
}

/** An ISO value as marked: "ISO 1600". */
export const formatIso = (iso: number | null | undefined) => (iso ? `ISO ${iso}` : '—');

/** log2 of an ISO value: the chart's x position, so each stop is the same distance. */
export const isoToX = (iso: number) => Math.log2(iso);
/** The ISO value at a chart position, rounded to a whole number (nominal values stay as marked). */
export const xToIso = (x: number) => Math.round(2 ** x);

/** The verdict in one line: "Ceiling ISO 1600" / "Latitude window −1 to +2 stops", or why there is none. */
export function verdictHeadline(verdict: ReadoutVerdict): string {
  if (verdict.stepsMeasured === 0) return verdict.kind === 'noise' ? 'Ceiling ISO: not measured yet' : 'Latitude window: not measured yet';
  if (verdict.kind === 'noise') return verdict.ceilingIso !== null ? `Ceiling ISO ${verdict.ceilingIso}` : 'Ceiling ISO: no step meets the threshold';
  const w = verdict.latitudeWindow;
  if (!w) return 'Latitude window: the reference step is not within the threshold';
  return w.minStops === w.maxStops ? 'Latitude window: the reference step only' : `Latitude window ${formatStopsShort(w.minStops)} to ${formatStopsShort(w.maxStops)} stops`;
}

/** The rule behind the verdict, with the threshold in force: "Highest ISO with SNR ≥ 20 dB". */
export function verdictRule(verdict: ReadoutVerdict): string {
  return verdict.kind === 'noise'
    ? `Highest measured ISO whose SNR on the region is at least ${formatNumber(verdict.thresholds.snrThresholdDb, 1)} dB`
    : `Offsets around 0 whose mean ΔE00 against the 0-stop frame stays at or below ${formatNumber(verdict.thresholds.deltaEThreshold, 1)}`;
}

/** Where the threshold comes from: the documented default, or the channel's own choice. */
export function thresholdSource(kind: 'noise' | 'recovery', thresholds: ReadoutThresholds): string {
  if (kind === 'noise') {
    return thresholds.snrThresholdDb === DEFAULT_THRESHOLDS.snrThresholdDb
      ? 'Default 20 dB = S/N 10:1, the “first acceptable” level of ISO 12232:2019 (noise-based speed). Admins can change it on the Team page.'
      : `Set by this channel’s admins (default 20 dB, S/N 10:1 after ISO 12232:2019).`;
  }
  return thresholds.deltaEThreshold === DEFAULT_THRESHOLDS.deltaEThreshold
    ? 'Default ΔE00 2.5: a mean difference over a picture above about 2.5 is noticed (Song & Luo, 2001); 2–3 is the range usually taken as just noticeable. Admins can change it on the Team page.'
    : `Set by this channel’s admins (default ΔE00 2.5, after Song & Luo 2001).`;
}
