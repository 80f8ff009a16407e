/**
 * Ceiling ISO and latitude window from per-step readouts, with their default thresholds
 * (issue 6). The figures back the host's verdict; the UI shows the threshold beside them.
 */

/**
 * Default SNR threshold for the ceiling ISO: 20 dB, i.e. SNR 10:1.
 * ISO 12232:2019 §6.3 (noise-based speed), note 3: S/N 40 gives the "first excellent" and S/N 10
 * the "first acceptable" image (prints at about 70 sensor pixels/cm viewed at 25 cm); 20·log10(10)
 * = 20 dB. A ceiling is the last acceptable step, so the "acceptable" figure is the default.
 * Caveat: ISO 12232 weights noise visually at a defined exposure; we apply the ratio to plain
 * pixel-level linear-luma σ on the user's patch, which reads noisier, so the default is lenient
 * rather than strict. A channel can raise it (e.g. to SNR_EXCELLENT_DB) in its settings.
 */
export const DEFAULT_SNR_THRESHOLD_DB = 20;

/** ISO 12232:2019 §6.3 note 3 "first excellent" S/N 40, in dB: 20·log10(40) ≈ 32.04. */
export const SNR_EXCELLENT_DB = 20 * Math.log10(40);

/**
 * Default ΔE00 threshold for the latitude window: 2.5 (mean over the frame).
 * Song & Luo (2001), "Colorimetric thresholds for printed images", IS&T 9th Color Imaging Conf.,
 * pp. 219–223: for pictorial images compared pixel by pixel, a mean ΔE above about 2.5 is
 * perceptible to observers. Their figure is in CIELAB ΔE*ab; we carry it over to ΔE00 as our
 * judgment (ΔE00 reads lower than ΔE*ab for saturated colours, so 2.5 ΔE00 is a little more
 * tolerant there). It sits inside the 2–3 range usually taken as just noticeable; Mahy et al.
 * (1994) put the CIELAB JND at 2.3 (as cited in public summaries, not read in the original).
 */
export const DEFAULT_DELTA_E_THRESHOLD = 2.5;

/** One ISO sweep step: ISO value and its SNR in dB (null when the readout has no finite SNR). */
export interface IsoStep {
  iso: number;
  snrDb: number | null;
}

/**
 * Ceiling ISO: the highest ISO whose SNR is at or above `thresholdDb`; null when no step
 * qualifies. Steps need not be sorted or monotonic: on a sensor with two native gains a higher
 * ISO can beat a lower one, and the highest qualifying step is the answer. A null or NaN SNR
 * never qualifies: on a camera frame σ = 0 means the patch sits clipped or crushed flat, which
 * says nothing good about noise.
 */
export function ceilingIso(steps: readonly IsoStep[], thresholdDb: number = DEFAULT_SNR_THRESHOLD_DB): number | null {
  if (!Number.isFinite(thresholdDb)) throw new RangeError('thresholdDb must be a finite number');
  let ceiling: number | null = null;
  for (const { iso, snrDb } of steps) {
    if (!(iso > 0) || !Number.isFinite(iso)) throw new RangeError(`ISO must be a positive number, got ${iso}`);
    const passes = snrDb !== null && snrDb >= thresholdDb;
    if (passes && (ceiling === null || iso > ceiling)) ceiling = iso;
  }
  return ceiling;
}

/** One latitude bracket step: stop offset from the reference and its mean ΔE00. */
export interface LatitudeStep {
  offsetStops: number;
  meanDeltaE: number;
}

/** The latitude window: the contiguous run of offsets around 0 that stay within the threshold. */
export interface LatitudeWindow {
  /** Lowest (most negative) offset in the window, stops. */
  minStops: number;
  /** Highest offset in the window, stops. */
  maxStops: number;
  /** Offsets in the window, ascending. */
  offsets: number[];
}

/** Offsets closer than this are the same step (third stops are stored as 0.333…/0.3333). */
const SAME_OFFSET_STOPS = 1e-6;

/**
 * Latitude window: starting at the 0-stop reference and walking outwards in each direction,
 * the offsets whose mean ΔE00 is ≤ `threshold`, stopping at the first step that fails (a
 * recovered −3 after a failed −2 does not count: the window is contiguous). Null when no
 * 0-stop step exists or it fails itself. An offset listed twice passes only if both pass.
 */
export function latitudeWindow(
  steps: readonly LatitudeStep[],
  threshold: number = DEFAULT_DELTA_E_THRESHOLD,
): LatitudeWindow | null {
  if (!Number.isFinite(threshold) || threshold < 0) throw new RangeError('threshold must be a finite number ≥ 0');
  // Merge duplicate offsets, keeping the worst ΔE.
  const sorted = [...steps].sort((a, b) => a.offsetStops - b.offsetStops);
  const merged: LatitudeStep[] = [];
  for (const step of sorted) {
    if (!Number.isFinite(step.offsetStops)) throw new RangeError('offsetStops must be finite');
    const last = merged[merged.length - 1];
    const deltaE = Number.isNaN(step.meanDeltaE) ? Number.POSITIVE_INFINITY : step.meanDeltaE;
    if (last && Math.abs(last.offsetStops - step.offsetStops) < SAME_OFFSET_STOPS) {
      last.meanDeltaE = Math.max(last.meanDeltaE, deltaE);
    } else {
      merged.push({ offsetStops: step.offsetStops, meanDeltaE: deltaE });
    }
  }
  const zero = merged.findIndex((s) => Math.abs(s.offsetStops) < SAME_OFFSET_STOPS);
  if (zero < 0 || !(merged[zero].meanDeltaE <= threshold)) return null;
  let lo = zero;
  while (lo > 0 && merged[lo - 1].meanDeltaE <= threshold) lo--;
  let hi = zero;
  while (hi < merged.length - 1 && merged[hi + 1].meanDeltaE <= threshold) hi++;
  const offsets = merged.slice(lo, hi + 1).map((s) => (Math.abs(s.offsetStops) < SAME_OFFSET_STOPS ? 0 : s.offsetStops));
  return { minStops: offsets[0], maxStops: offsets[offsets.length - 1], offsets };
}
