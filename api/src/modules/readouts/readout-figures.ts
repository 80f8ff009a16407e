// From decoded frames to the figures a readout stores (NoiseResults / RecoveryResults in shared).
// Pure apart from sharp: the job calls it on frames from storage, the demo seed on synthetic ones,
// so both store exactly the same shape.
import sharp from 'sharp';
import type { NoiseResults, PatchFigures, PixelRegion, ReadoutGrid, ReadoutRegion, RecoveryResults, TransferName } from '@midgray/shared';
import { centreTenthRegion, exposureFractions, gridNoiseReadout, noiseReadout, recoveryReadout, type Frame, type RegionNoise } from './measure/index.ts';

/**
 * Version of the measurement method. Raise it whenever a change could move a figure (region
 * rounding, estimators, defaults), so results of different methods are never compared unknowingly.
 */
export const READOUT_ENGINE_VERSION = '1.0.0';

/** "readouts 1.0.0; sharp 0.35.5; libvips 8.x" plus `extra` (the ffmpeg version when a video was read). */
export function softwareVersion(extra?: string | null): string {
  const parts = [`readouts ${READOUT_ENGINE_VERSION}`, `sharp ${sharp.versions.sharp}`, `libvips ${sharp.versions.vips}`];
  if (extra) parts.push(extra);
  return parts.join('; ');
}

/**
 * The pixel rectangle of a region given in fractions of the frame (null: the centre tenth).
 * Edges are rounded to the nearest pixel and kept inside the frame; at least 1×1 pixel.
 */
export function regionToPixels(width: number, height: number, region: ReadoutRegion | null): PixelRegion {
  if (!region) return centreTenthRegion(width, height);
  const x0 = Math.min(width - 1, Math.max(0, Math.round(region.x * width)));
  const y0 = Math.min(height - 1, Math.max(0, Math.round(region.y * height)));
  const x1 = Math.min(width, Math.max(x0 + 1, Math.round((region.x + region.w) * width)));
  const y1 = Math.min(height, Math.max(y0 + 1, Math.round((region.y + region.h) * height)));
  return { x: x0, y: y0, w: x1 - x0, h: y1 - y0 };
}

function patchFigures(n: RegionNoise): PatchFigures {
  return {
    region: n.region,
    pixelCount: n.pixelCount,
    meanLinearLuma: n.meanLinearLuma,
    sigmaLinearLuma: n.sigmaLinearLuma,
    snrDb: n.snrDb,
    meanL: n.meanL,
    meanA: n.meanA,
    meanB: n.meanB,
    chromaSigmaA: n.chromaSigmaA,
    chromaSigmaB: n.chromaSigmaB,
    chromaNoise: Math.hypot(n.chromaSigmaA, n.chromaSigmaB),
  };
}

/**
 * Index of the patch nearest a neutral mid grey: the smallest CIELAB distance (ΔE*ab) of its mean
 * colour from L* 50, a* = b* = 0. Ties go to the lower index, so the pick is deterministic.
 */
export function neutralPatchIndex(patches: ReadonlyArray<Pick<PatchFigures, 'meanL' | 'meanA' | 'meanB'>>): number {
  let best = 0;
  let bestDistance = Number.POSITIVE_INFINITY;
  patches.forEach((p, i) => {
    const d = Math.hypot(p.meanL - 50, p.meanA, p.meanB);
    if (d < bestDistance) {
      bestDistance = d;
      best = i;
    }
  });
  return best;
}

export interface NoiseFigureOptions {
  region: ReadoutRegion | null;
  grid: ReadoutGrid | null;
  transfer: TransferName;
}

/**
 * Noise readout figures: on the region, or with a grid on each patch of the region, the headline
 * figures then coming from the chosen patch (default the one nearest neutral mid grey).
 */
export function noiseFigures(frame: Frame, options: NoiseFigureOptions): NoiseResults {
  const regionPx = regionToPixels(frame.width, frame.height, options.region);
  const base = { kind: 'noise' as const, width: frame.width, height: frame.height, bitDepth: frame.bitDepth, transfer: options.transfer };
  if (options.grid) {
    const g = gridNoiseReadout(frame, regionPx, options.grid.cols, options.grid.rows, { transfer: options.transfer });
    const patches = g.patches.map((p) => ({ col: p.col, row: p.row, ...patchFigures(p) }));
    const patchIndex = options.grid.patch ?? neutralPatchIndex(patches);
    const { col: _col, row: _row, ...headline } = patches[patchIndex];
    return {
      ...base,
      ...headline,
      clippedFraction: g.clippedFraction,
      crushedFraction: g.crushedFraction,
      headline: 'patch',
      patchIndex,
      grid: { cols: g.cols, rows: g.rows, patches },
    };
  }
  const n = noiseReadout(frame, regionPx, { transfer: options.transfer });
  return { ...base, ...patchFigures(n), clippedFraction: n.clippedFraction, crushedFraction: n.crushedFraction, headline: 'region', patchIndex: null, grid: null };
}

export interface RecoveryFigureOptions {
  region: ReadoutRegion | null;
  transfer: TransferName;
  referenceTransfer?: TransferName;
  stride: number | null;
}

/** Recovery readout figures of `recovered` against `reference`, and the difference map PNG. */
export async function recoveryFigures(recovered: Frame, reference: Frame, options: RecoveryFigureOptions): Promise<{ results: RecoveryResults; differenceMap: Buffer }> {
  const regionPx = regionToPixels(recovered.width, recovered.height, options.region);
  const r = await recoveryReadout(recovered, reference, {
    transfer: options.transfer,
    referenceTransfer: options.referenceTransfer ?? options.transfer,
    region: regionPx,
    stride: options.stride ?? undefined,
  });
  const ref = exposureFractions(reference);
  return {
    results: {
      kind: 'recovery',
      width: recovered.width,
      height: recovered.height,
      bitDepth: recovered.bitDepth,
      transfer: options.transfer,
      stride: r.stride,
      sampleCount: r.sampleCount,
      meanDeltaE: r.meanDeltaE,
      p95DeltaE: r.p95DeltaE,
      maxDeltaE: r.maxDeltaE,
      clippedFraction: r.clippedFraction,
      crushedFraction: r.crushedFraction,
      referenceClippedFraction: ref.clippedFraction,
      referenceCrushedFraction: ref.crushedFraction,
      region: r.region,
      referenceSigmaLinearLuma: r.referenceSigmaLinearLuma,
      recoveredSigmaLinearLuma: r.recoveredSigmaLinearLuma,
      noiseRatio: r.noiseRatio,
      noiseStops: r.noiseStops,
      mapWidth: r.mapWidth,
      mapHeight: r.mapHeight,
    },
    differenceMap: r.differenceMap,
  };
}

/** Widest preview of a measured frame, in pixels. */
export const FRAME_PREVIEW_WIDTH = 1280;

/**
 * A JPEG of the frame as measured, for the Readouts tab (thumbnails, region picker, wipe view):
 * the codes shown as they are (8-bit), scaled down to at most FRAME_PREVIEW_WIDTH wide.
 */
export async function framePreview(frame: Frame, maxWidth = FRAME_PREVIEW_WIDTH): Promise<Buffer> {
  const image = sharp(frame.data, { raw: { width: frame.width, height: frame.height, channels: 3 } });
  const typed = frame.bitDepth === 16 ? image.toColourspace('srgb') : image;
  return typed
    .resize({ width: Math.min(maxWidth, frame.width), withoutEnlargement: true })
    .jpeg({ quality: 82, mozjpeg: true })
    .toBuffer();
}
