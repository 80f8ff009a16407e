/**
 * Noise readout (ISO sweep steps, issue 6): luma noise in linear light, chroma noise and colour
 * cast in CIELAB on a region; clipped and crushed fractions of the whole frame.
 *
 * Statistics are population statistics (divide by N, not N − 1): the region is the whole
 * population we report on, and with thousands of pixels the difference is below 0.01 %.
 * SNR = 20·log10(mean / σ) on linear luma, the form ISO 15739 and ISO 12232 use for
 * signal-to-noise ratios (as a ratio; we state it in dB).
 */
import { LUMA_709, rgbToXyz, xyzToLab } from '@midgray/shared/color';
import { checkFrame, checkedRegion, centreTenthRegion, linearLut, maxCode, type Frame, type Region, type Transfer } from './frame.ts';

/** Options shared by the readouts. */
export interface MeasureOptions {
  /** Encoding of the codes; default `srgb` (pass `bt709` for frames extracted from BT.709 video). */
  transfer?: Transfer;
  /**
   * A pixel is clipped when any channel is ≥ maxCode − floor(clipTolerance · maxCode).
   * Default 0.002 (0.2 % of full scale): 16-bit ≥ 65404, 8-bit = 255 — our choice, so that
   * a highlight sitting a hair under full scale after compression or dithering still counts.
   */
  clipTolerance?: number;
  /**
   * A pixel is crushed when its BT.709 luma code (0.2126 R' + 0.7152 G' + 0.0722 B' on the
   * full-range codes) is ≤ crushLevel · maxCode. Default 0.005 (0.5 % of full scale: 16-bit ≤ 327,
   * 8-bit ≤ 1) — our choice: shadows that have reached the floor, not merely dark ones.
   * Codes are read as full range (PNG frames are; the frame extractor expands video range).
   */
  crushLevel?: number;
}

/** Default clip tolerance, fraction of full scale (see `MeasureOptions.clipTolerance`). */
export const DEFAULT_CLIP_TOLERANCE = 0.002;
/** Default crush level, fraction of full scale (see `MeasureOptions.crushLevel`). */
export const DEFAULT_CRUSH_LEVEL = 0.005;

/** Statistics of one region. */
export interface RegionNoise {
  region: Region;
  pixelCount: number;
  /** Mean of linear luma (BT.709 weights on linear RGB), 0…1. */
  meanLinearLuma: number;
  /** Population standard deviation of linear luma, same unit. */
  sigmaLinearLuma: number;
  /** 20·log10(mean / σ) in dB; null when σ = 0 or mean ≤ 0 (no finite ratio). */
  snrDb: number | null;
  /** Mean L* (CIE 15, D65). */
  meanL: number;
  /** Mean a* and b*: the colour cast (+a* magenta, −a* green, +b* yellow, −b* blue). */
  meanA: number;
  meanB: number;
  /** Population σ of a* and of b*: chroma noise, CIELAB units. */
  chromaSigmaA: number;
  chromaSigmaB: number;
}

/** Clipped and crushed shares of a whole frame. */
export interface ExposureFractions {
  /** Share of pixels (0…1) with any channel at or above the clip threshold. */
  clippedFraction: number;
  /** Share of pixels (0…1) whose luma code is at or below the crush level. */
  crushedFraction: number;
}

/** A noise readout: the region's statistics plus the whole frame's clipped/crushed fractions. */
export interface NoiseReadout extends RegionNoise, ExposureFractions {
  transfer: Transfer;
  bitDepth: 8 | 16;
}

/** A grid readout: one `RegionNoise` per patch (row-major) plus the whole frame's fractions. */
export interface GridNoiseReadout extends ExposureFractions {
  cols: number;
  rows: number;
  transfer: Transfer;
  bitDepth: 8 | 16;
  patches: Array<RegionNoise & { col: number; row: number }>;
}

/** Clip threshold (code) and crush level (luma code) for a frame under the options. */
export function exposureThresholds(frame: Pick<Frame, 'bitDepth'>, options: MeasureOptions = {}) {
  const max = maxCode(frame);
  const clipTolerance = options.clipTolerance ?? DEFAULT_CLIP_TOLERANCE;
  const crushLevel = options.crushLevel ?? DEFAULT_CRUSH_LEVEL;
  if (!(clipTolerance >= 0 && clipTolerance < 1)) throw new RangeError('clipTolerance must be in [0, 1)');
  if (!(crushLevel >= 0 && crushLevel < 1)) throw new RangeError('crushLevel must be in [0, 1)');
  return { clipCode: max - Math.floor(clipTolerance * max), crushLuma: crushLevel * max };
}

/** Clipped and crushed fractions of the whole frame (every pixel, one pass). */
export function exposureFractions(frame: Frame, options: MeasureOptions = {}): ExposureFractions {
  const { clipCode, crushLuma } = exposureThresholds(frame, options);
  const data = frame.data;
  const kr = LUMA_709.r, kg = LUMA_709.g, kb = LUMA_709.b;
  let clipped = 0;
  let crushed = 0;
  for (let i = 0, n = data.length; i < n; i += 3) {
    const r = data[i], g = data[i + 1], b = data[i + 2];
    if (r >= clipCode || g >= clipCode || b >= clipCode) clipped++;
    if (kr * r + kg * g + kb * b <= crushLuma) crushed++;
  }
  const pixels = frame.width * frame.height;
  return { clippedFraction: clipped / pixels, crushedFraction: crushed / pixels };
}

// Reused per call to keep the pixel loop free of allocation.
const rgbBuf = new Float64Array(3);
const labBuf = new Float64Array(3);

/** Luma and CIELAB statistics of one region, with a prepared linearisation table. */
export function regionNoise(frame: Frame, region: Region, lut: Float64Array): RegionNoise {
  const { x, y, w, h } = checkedRegion(frame, region);
  const data = frame.data;
  const width = frame.width;
  const kr = LUMA_709.r, kg = LUMA_709.g, kb = LUMA_709.b;
  // Shifted sums (shift = first pixel) keep Σ(v − k)² well conditioned when σ ≪ mean.
  const first = (y * width + x) * 3;
  const r0 = lut[data[first]], g0 = lut[data[first + 1]], b0 = lut[data[first + 2]];
  rgbBuf[0] = r0; rgbBuf[1] = g0; rgbBuf[2] = b0;
  xyzToLab(rgbToXyz(rgbBuf, labBuf), labBuf);
  const kY = kr * r0 + kg * g0 + kb * b0, kL = labBuf[0], kA = labBuf[1], kB = labBuf[2];
  let sY = 0, sYY = 0, sL = 0, sA = 0, sAA = 0, sB = 0, sBB = 0;
  for (let row = y; row < y + h; row++) {
    let i = (row * width + x) * 3;
    const end = i + w * 3;
    for (; i < end; i += 3) {
      const r = lut[data[i]], g = lut[data[i + 1]], b = lut[data[i + 2]];
      const dY = kr * r + kg * g + kb * b - kY;
      sY += dY;
      sYY += dY * dY;
      rgbBuf[0] = r; rgbBuf[1] = g; rgbBuf[2] = b;
      xyzToLab(rgbToXyz(rgbBuf, labBuf), labBuf);
      sL += labBuf[0] - kL;
      const dA = labBuf[1] - kA, dB = labBuf[2] - kB;
      sA += dA;
      sAA += dA * dA;
      sB += dB;
      sBB += dB * dB;
    }
  }
  const n = w * h;
  const meanDY = sY / n, meanDA = sA / n, meanDB = sB / n;
  const sigmaY = Math.sqrt(Math.max(0, sYY / n - meanDY * meanDY));
  const meanY = kY + meanDY;
  return {
    region: { x, y, w, h },
    pixelCount: n,
    meanLinearLuma: meanY,
    sigmaLinearLuma: sigmaY,
    snrDb: sigmaY > 0 && meanY > 0 ? 20 * Math.log10(meanY / sigmaY) : null,
    meanL: kL + sL / n,
    meanA: kA + meanDA,
    meanB: kB + meanDB,
    chromaSigmaA: Math.sqrt(Math.max(0, sAA / n - meanDA * meanDA)),
    chromaSigmaB: Math.sqrt(Math.max(0, sBB / n - meanDB * meanDB)),
  };
}

/**
 * Noise readout of `region` (default: the centre tenth, see `centreTenthRegion`), with the
 * clipped/crushed fractions of the whole frame.
 */
export function noiseReadout(frame: Frame, region?: Region | null, options: MeasureOptions = {}): NoiseReadout {
  checkFrame(frame);
  const transfer = options.transfer ?? 'srgb';
  const stats = regionNoise(frame, region ?? centreTenthRegion(frame.width, frame.height), linearLut(frame.bitDepth, transfer));
  return { ...stats, ...exposureFractions(frame, options), transfer, bitDepth: frame.bitDepth };
}

/** Options of `gridNoiseReadout`. */
export interface GridOptions extends MeasureOptions {
  /**
   * Share of each cell's width and height left out on every side, so patch borders and
   * gaps stay out of the statistics. Default 0.2 (the middle 60 % × 60 % of each cell).
   */
  cellInset?: number;
}

/**
 * Per-patch noise readouts for a chart: `region` is divided into cols × rows equal cells
 * (e.g. 6 × 4) and each cell is measured on its inset middle. Patches are row-major.
 */
export function gridNoiseReadout(
  frame: Frame,
  region: Region,
  cols: number,
  rows: number,
  options: GridOptions = {},
): GridNoiseReadout {
  checkFrame(frame);
  const area = checkedRegion(frame, region);
  if (!Number.isInteger(cols) || !Number.isInteger(rows) || cols < 1 || rows < 1) {
    throw new RangeError('cols and rows must be positive integers');
  }
  const inset = options.cellInset ?? 0.2;
  if (!(inset >= 0 && inset < 0.5)) throw new RangeError('cellInset must be in [0, 0.5)');
  const transfer = options.transfer ?? 'srgb';
  const lut = linearLut(frame.bitDepth, transfer);
  const patches: GridNoiseReadout['patches'] = [];
  for (let row = 0; row < rows; row++) {
    for (let col = 0; col < cols; col++) {
      const x0 = area.x + Math.round((area.w * col) / cols);
      const x1 = area.x + Math.round((area.w * (col + 1)) / cols);
      const y0 = area.y + Math.round((area.h * row) / rows);
      const y1 = area.y + Math.round((area.h * (row + 1)) / rows);
      const dx = Math.floor((x1 - x0) * inset);
      const dy = Math.floor((y1 - y0) * inset);
      const cell = { x: x0 + dx, y: y0 + dy, w: Math.max(1, x1 - x0 - 2 * dx), h: Math.max(1, y1 - y0 - 2 * dy) };
      patches.push({ col, row, ...regionNoise(frame, cell, lut) });
    }
  }
  return { cols, rows, transfer, bitDepth: frame.bitDepth, patches, ...exposureFractions(frame, options) };
}
