/**
 * Recovery readout (latitude bracket steps, issue 6): CIEDE2000 between a recovered frame and
 * the reference (0-stop) frame, sampled on a regular pixel grid; clipped/crushed fractions of
 * the recovered frame; noise relative to the reference; a false-colour difference map.
 */
import sharp from 'sharp';
import { InvalidInputError } from '@midgray/shared/errors';
import { deltaE2000, rgbToXyz, xyzToLab } from '@midgray/shared/color';
import { centreTenthRegion, checkFrame, checkedRegion, linearLut, type Frame, type Region, type Transfer } from './frame.ts';
import { exposureFractions, regionNoise, type ExposureFractions, type MeasureOptions } from './noise.ts';

/** Options of the recovery readout. */
export interface RecoveryOptions extends MeasureOptions {
  /** Encoding of the reference frame's codes; default: the same as `transfer`. */
  referenceTransfer?: Transfer;
  /** Sample every `stride`-th pixel across and down; default `defaultRecoveryStride(width, height)`. */
  stride?: number;
  /** Region for the noise comparison; default the centre tenth. */
  region?: Region | null;
  /** Width of the difference map in cells (pixels of the PNG); default 160, at most width / stride. */
  mapWidth?: number;
}

/** The recovery figures (everything but the rendered map image). */
export interface RecoveryMeasurement extends ExposureFractions {
  stride: number;
  sampleCount: number;
  /** Mean ΔE00 over the sampled pixels. */
  meanDeltaE: number;
  /** 95th percentile ΔE00, nearest-rank: the smallest sample with at least 95 % of samples ≤ it. */
  p95DeltaE: number;
  /** Largest sampled ΔE00. */
  maxDeltaE: number;
  /** Region of the noise comparison. */
  region: Region;
  /** Population σ of linear luma in the region, reference and recovered frames. */
  referenceSigmaLinearLuma: number;
  recoveredSigmaLinearLuma: number;
  /** σ recovered / σ reference (1 = same noise); null when the reference σ is 0. */
  noiseRatio: number | null;
  /** log2 of `noiseRatio`: stops of extra noise (+1 = twice the σ); null when the ratio is null or 0. */
  noiseStops: number | null;
  /** Mean ΔE00 per map cell, row-major, `mapWidth` × `mapHeight`. */
  cells: Float32Array;
  mapWidth: number;
  mapHeight: number;
}

/** The recovery readout with its difference map rendered as PNG. */
export interface RecoveryReadout extends Omit<RecoveryMeasurement, 'cells'> {
  /** False-colour PNG of mean ΔE00 per cell, `mapWidth` × `mapHeight` pixels (legend: `DIFFERENCE_MAP_LEGEND`). */
  differenceMap: Buffer;
}

/**
 * Samples the ΔE loop aims for: about half a million. Our choice: the p95 of 500 000 samples
 * has a sampling error far below the 0.01 the UI shows, and the stride this gives at 4K keeps
 * decode + readout within the 2× decode-time budget of issue 6 (see api/bench/readout.bench.ts).
 */
export const RECOVERY_SAMPLE_BUDGET = 500_000;

/**
 * Default stride: round(√(pixels / RECOVERY_SAMPLE_BUDGET)), at least 1 — every pixel up to about
 * 1 MP, 2 at 1920×1080 and 4 at 3840×2160 (both 518 400 samples), 8 at 7680×4320.
 */
export function defaultRecoveryStride(width: number, height: number): number {
  return Math.max(1, Math.round(Math.sqrt((width * height) / RECOVERY_SAMPLE_BUDGET)));
}

/**
 * Colour stops of the difference map, linear interpolation between stops in 8-bit sRGB; values
 * at or above the last stop take its colour. Legend: 0 near-black · 1 dark blue · 2.5 teal (the
 * default latitude threshold) · 5 yellow · ≥ 10 bright pink-red. Cells without samples are mid grey.
 */
export const DIFFERENCE_MAP_LEGEND: ReadonlyArray<{ deltaE: number; rgb: readonly [number, number, number] }> = [
  { deltaE: 0, rgb: [16, 16, 24] },
  { deltaE: 1, rgb: [30, 60, 150] },
  { deltaE: 2.5, rgb: [0, 160, 160] },
  { deltaE: 5, rgb: [240, 210, 40] },
  { deltaE: 10, rgb: [255, 60, 120] },
];
const NO_DATA_RGB = [128, 128, 128] as const;

/** The 8-bit sRGB colour of a ΔE00 value on the difference map. */
export function differenceMapColour(deltaE: number): readonly [number, number, number] {
  if (!Number.isFinite(deltaE)) return NO_DATA_RGB;
  const stops = DIFFERENCE_MAP_LEGEND;
  if (deltaE <= stops[0].deltaE) return stops[0].rgb;
  for (let i = 1; i < stops.length; i++) {
    if (deltaE < stops[i].deltaE) {
      const a = stops[i - 1], b = stops[i];
      const t = (deltaE - a.deltaE) / (b.deltaE - a.deltaE);
      return [0, 1, 2].map((k) => Math.round(a.rgb[k] + (b.rgb[k] - a.rgb[k]) * t)) as unknown as [number, number, number];
    }
  }
  return stops[stops.length - 1].rgb;
}

/** k-th smallest value (0-based) of `values`, reordering it in place (Hoare quickselect, median-of-three). */
export function selectKth(values: Float32Array, k: number): number {
  let lo = 0;
  let hi = values.length - 1;
  while (hi > lo) {
    const mid = (lo + hi) >>> 1;
    // Median of three as pivot keeps sorted and constant runs from going quadratic.
    const a = values[lo], b = values[mid], c = values[hi];
    const pivot = a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        const t = values[i];
        values[i] = values[j];
        values[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return values[k];
  }
  return values[k];
}

// Reused buffers: the ΔE loop allocates nothing per pixel.
const rgbA = new Float64Array(3), labA = new Float64Array(3);
const rgbB = new Float64Array(3), labB = new Float64Array(3);

/** Recovery figures without rendering the map: ΔE00 statistics, fractions, noise ratio, map cells. */
export function measureRecovery(recovered: Frame, reference: Frame, options: RecoveryOptions = {}): RecoveryMeasurement {
  checkFrame(recovered);
  checkFrame(reference);
  const { width, height } = recovered;
  if (reference.width !== width || reference.height !== height) {
    throw new InvalidInputError(
      `recovered frame is ${width}×${height} but the reference is ${reference.width}×${reference.height}`,
      'frame',
    );
  }
  const stride = options.stride ?? defaultRecoveryStride(width, height);
  if (!Number.isInteger(stride) || stride < 1) throw new InvalidInputError('stride must be a positive integer', 'stride');
  const transfer = options.transfer ?? 'srgb';
  const lutRec = linearLut(recovered.bitDepth, transfer);
  const lutRef = linearLut(reference.bitDepth, options.referenceTransfer ?? transfer);

  const columns = Math.ceil(width / stride);
  const lines = Math.ceil(height / stride);
  const mapWidth = Math.max(1, Math.min(options.mapWidth ?? 160, Math.floor(width / stride)));
  const mapHeight = Math.max(1, Math.min(Math.round((height * mapWidth) / width), Math.floor(height / stride)));
  const cellOfColumn = new Int32Array(columns);
  for (let c = 0; c < columns; c++) cellOfColumn[c] = Math.min(mapWidth - 1, Math.floor((c * stride * mapWidth) / width));
  const cellSum = new Float64Array(mapWidth * mapHeight);
  const cellCount = new Uint32Array(mapWidth * mapHeight);

  const samples = new Float32Array(columns * lines);
  const dataRec = recovered.data;
  const dataRef = reference.data;
  const sameDepth = recovered.bitDepth === reference.bitDepth && lutRec === lutRef;
  let n = 0;
  let sum = 0;
  let max = 0;
  for (let y = 0; y < height; y += stride) {
    const cellRow = Math.min(mapHeight - 1, Math.floor((y * mapHeight) / height)) * mapWidth;
    let i = y * width * 3;
    for (let c = 0; c < columns; c++, i += stride * 3) {
      const r1 = dataRec[i], g1 = dataRec[i + 1], b1 = dataRec[i + 2];
      const r2 = dataRef[i], g2 = dataRef[i + 1], b2 = dataRef[i + 2];
      let d = 0;
      // Identical codes through the same table give identical L*a*b*: ΔE00 is exactly 0.
      if (!(sameDepth && r1 === r2 && g1 === g2 && b1 === b2)) {
        rgbA[0] = lutRec[r1]; rgbA[1] = lutRec[g1]; rgbA[2] = lutRec[b1];
        rgbB[0] = lutRef[r2]; rgbB[1] = lutRef[g2]; rgbB[2] = lutRef[b2];
        xyzToLab(rgbToXyz(rgbA, labA), labA);
        xyzToLab(rgbToXyz(rgbB, labB), labB);
        d = deltaE2000(labB, labA);
      }
      samples[n++] = d;
      sum += d;
      if (d > max) max = d;
      const cell = cellRow + cellOfColumn[c];
      cellSum[cell] += d;
      cellCount[cell]++;
    }
  }

  const cells = new Float32Array(mapWidth * mapHeight);
  for (let k = 0; k < cells.length; k++) cells[k] = cellCount[k] > 0 ? cellSum[k] / cellCount[k] : Number.NaN;

  const region = checkedRegion(recovered, options.region ?? centreTenthRegion(width, height));
  const refNoise = regionNoise(reference, region, lutRef);
  const recNoise = regionNoise(recovered, region, lutRec);
  const noiseRatio = refNoise.sigmaLinearLuma > 0 ? recNoise.sigmaLinearLuma / refNoise.sigmaLinearLuma : null;

  return {
    stride,
    sampleCount: n,
    meanDeltaE: sum / n,
    p95DeltaE: selectKth(samples, Math.ceil(0.95 * n) - 1),
    maxDeltaE: max,
    ...exposureFractions(recovered, options),
    region,
    referenceSigmaLinearLuma: refNoise.sigmaLinearLuma,
    recoveredSigmaLinearLuma: recNoise.sigmaLinearLuma,
    noiseRatio,
    noiseStops: noiseRatio !== null && noiseRatio > 0 ? Math.log2(noiseRatio) : null,
    cells,
    mapWidth,
    mapHeight,
  };
}

/** PNG (8-bit sRGB) of per-cell ΔE00 values coloured by `DIFFERENCE_MAP_LEGEND`. */
export async function renderDifferenceMap(cells: Float32Array, mapWidth: number, mapHeight: number): Promise<Buffer> {
  const pixels = new Uint8Array(mapWidth * mapHeight * 3);
  for (let k = 0; k < cells.length; k++) pixels.set(differenceMapColour(cells[k]), k * 3);
  return sharp(pixels, { raw: { width: mapWidth, height: mapHeight, channels: 3 } }).png().toBuffer();
}

/** Recovery readout of `recovered` against `reference` (same size), with the difference map PNG. */
export async function recoveryReadout(
  recovered: Frame,
  reference: Frame,
  options: RecoveryOptions = {},
): Promise<RecoveryReadout> {
  const { cells, ...figures } = measureRecovery(recovered, reference, options);
  return { ...figures, differenceMap: await renderDifferenceMap(cells, figures.mapWidth, figures.mapHeight) };
}
