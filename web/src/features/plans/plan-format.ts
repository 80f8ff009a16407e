// How plan numbers read in the Plan tab and on the shot list.
import { formatAngle, formatDensity, formatFNumber, formatSeconds, formatStops, type PlannedSettings, type TestKind } from '@midgray/shared';

/** Starting inputs for a new test of each kind; the generator accepts them as they are. */
export function defaultInputs(kind: TestKind): Record<string, unknown> {
  const base = { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24000 / 1001, ndDensity: 0.9 };
  const kit = { minFNumber: 1.4, maxFNumber: 16, ndDensities: [0, 0.3, 0.6, 0.9, 1.2, 1.5, 1.8, 2.1], shutterAngles: [180], lightsDimmable: false, lightDownStops: 0, lightUpStops: 0 };
  const priority = ['nd', 'aperture', 'shutter', 'light'];
  if (kind === 'iso_sweep') return { baseIso: 800, minIso: 100, maxIso: 12800, step: 'full', base, kit, priority };
  if (kind === 'latitude_bracket') return { baseIso: 800, base, maxOffsetStops: 3, step: 'full', kit, priority };
  return { fps: 24000 / 1001, steps: [{ label: 'Step 1', notes: '' }] };
}

/** Default name of a new test. */
export function defaultName(kind: TestKind, inputs: Record<string, unknown>): string {
  if (kind === 'iso_sweep') return `ISO sweep ${inputs.minIso}–${inputs.maxIso}`;
  if (kind === 'latitude_bracket') return `Latitude bracket ±${inputs.maxOffsetStops}`;
  return 'Custom test';
}

export const dash = '—';
export const fmtIso = (v: number | null | undefined) => (v === null || v === undefined ? dash : String(v));
export const fmtF = (v: number | null | undefined) => (v === null || v === undefined ? dash : formatFNumber(v));
export const fmtNd = (v: number | null | undefined) => (v === null || v === undefined ? dash : formatDensity(v));
export const fmtLight = (v: number | null | undefined) => (v === null || v === undefined || v === 0 ? dash : `${formatStops(v)} st`);
export function fmtShutter(p: Pick<PlannedSettings, 'shutterAngleDeg' | 'shutterSeconds'>) {
  if (p.shutterAngleDeg === null) return dash;
  return p.shutterSeconds === null ? formatAngle(p.shutterAngleDeg) : `${formatAngle(p.shutterAngleDeg)} (${formatSeconds(p.shutterSeconds)})`;
}
/** Exposure error left at a step ("+0.27", "−1"), or a dash when there is none. */
export const fmtError = (v: number | undefined) => (v === undefined || Math.abs(v) < 0.005 ? dash : formatStops(v));

/** "2 min 30 s", "1 h 05 min", "12 s". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return dash;
  const s = Math.round(seconds);
  if (s < 60) return `${s} s`;
  if (s < 3600) return `${Math.floor(s / 60)} min ${String(s % 60).padStart(2, '0')} s`;
  return `${Math.floor(s / 3600)} h ${String(Math.floor((s % 3600) / 60)).padStart(2, '0')} min`;
}
