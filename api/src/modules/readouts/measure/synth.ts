/**
 * Synthetic chart frames for tests, the benchmark and the demo seed (issue 6).
 *
 * INVENTED DATA. Nothing here was measured from a camera: the patch colours are our own formula
 * (not any commercial chart's reference values), the noise is ideal Gaussian, and the exposure
 * model is the simplest one that shows highlight clipping and shadow noise. Deterministic for a
 * given seed, so a test or a seed script gets the same pixels every run.
 *
 * Model, per pixel and channel, all in linear light (0…1):
 *   captured  = clamp(scene · 2^exposureOffsetStops + nLuma + nChannel, 0, 1), quantised to
 *               `captureBitDepth` bits — a sensor that clips at full well and has a finite ADC;
 *   recovered = captured · 2^−exposureOffsetStops when `recover` (the grade pulls the exposure
 *               back; clipped highlights stay flat, pushed shadows carry amplified noise);
 *   code      = round(encode(min(recovered, 1)) · maxCode) with the chosen transfer.
 * nLuma ~ N(0, noiseSigma) is shared by R, G and B, so it lands entirely in linear luma;
 * nChannel ~ N(0, chromaNoiseSigma) is independent per channel (chroma noise).
 */
import { InvalidInputError } from '@midgray/shared/errors';
import { bt709Oetf, linearToSrgb } from '@midgray/shared/color';
import type { Frame, Region, Transfer } from './frame.ts';

/** Options of `synthChartFrame`; every field has a default. */
export interface SynthChartOptions {
  /** Pixels; default 960 × 540. */
  width?: number;
  height?: number;
  /** RNG seed (any integer); default 1. */
  seed?: number;
  /** `chart`: patches on a dark surround; `flat`: one uniform colour over the whole frame. Default `chart`. */
  layout?: 'chart' | 'flat';
  /** Patch grid of the chart; default 6 × 4 (18 colour patches, then a row of 6 greys). */
  cols?: number;
  rows?: number;
  /** Linear RGB of the flat layout; default mid grey 0.18. */
  flatLinearRgb?: readonly [number, number, number];
  /** σ of the luma noise, linear light at capture; default 0. */
  noiseSigma?: number;
  /** σ of the independent per-channel noise, linear light at capture; default 0. */
  chromaNoiseSigma?: number;
  /** Stops over (+) or under (−) the reference exposure at capture; default 0. */
  exposureOffsetStops?: number;
  /** Apply −exposureOffsetStops after capture, as a latitude bracket's graded frame does; default true. */
  recover?: boolean;
  /** Bits of the simulated linear capture (ADC); default 12; 0 for no quantisation. */
  captureBitDepth?: number;
  /** Encoding of the output codes; default `srgb`. */
  transfer?: Transfer;
  /** Output depth; default 16. */
  bitDepth?: 8 | 16;
}

/** One patch of the synthetic chart: grid cell, pixel rectangle and its scene colour. */
export interface SyntheticPatch {
  col: number;
  row: number;
  rect: Region;
  /** Scene colour, linear RGB 0…1 (before exposure, noise and encoding). */
  linearRgb: readonly [number, number, number];
}

/** A synthetic frame and where its chart is, so tests can measure patches exactly. */
export interface SyntheticChart {
  frame: Frame;
  /** The area the cols × rows grid divides (the whole frame for `flat`). */
  chartRegion: Region;
  cols: number;
  rows: number;
  patches: SyntheticPatch[];
}

/** Linear level of the chart's surround (a dark card, about L* 27): invented. */
export const SYNTH_SURROUND_LINEAR = 0.05;

/** Seeded uniform generator on [0, 1): sfc32 with a splitmix32 seed expansion (public-domain algorithms). */
export function seededRandom(seed: number): () => number {
  let s = seed | 0;
  const splitmix = () => {
    s = (s + 0x9e3779b9) | 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  };
  let a = splitmix(), b = splitmix(), c = splitmix(), d = splitmix();
  return () => {
    const t = (((a + b) | 0) + d) | 0;
    d = (d + 1) | 0;
    a = b ^ (b >>> 9);
    b = (c + (c << 3)) | 0;
    c = (c << 21) | (c >>> 11);
    c = (c + t) | 0;
    return (t >>> 0) / 4294967296;
  };
}

/** Seeded standard normal generator (Box–Muller, both outputs used). */
export function seededGaussian(seed: number): () => number {
  const uniform = seededRandom(seed);
  let spare = 0;
  let hasSpare = false;
  return () => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    let u = 0;
    while (u === 0) u = uniform();
    const radius = Math.sqrt(-2 * Math.log(u));
    const angle = 2 * Math.PI * uniform();
    spare = radius * Math.sin(angle);
    hasSpare = true;
    return radius * Math.cos(angle);
  };
}

/**
 * The invented chart: rows − 1 rows of colour patches (hues evenly spaced, alternating two
 * saturations, encoded then linearised) and a last row of greys evenly spaced in L* from 96 to 20.
 */
export function syntheticPatchColours(cols: number, rows: number): Array<readonly [number, number, number]> {
  const colours: Array<readonly [number, number, number]> = [];
  const colourCount = cols * Math.max(0, rows - 1);
  for (let i = 0; i < colourCount; i++) {
    const hue = (i / colourCount) * 6; // 0…6 around the hexcone
    const saturation = i % 2 === 0 ? 0.65 : 0.4;
    const value = 0.55 + 0.3 * ((i * 7) % 5) / 4; // encoded brightness 0.55…0.85
    const chroma = value * saturation;
    const x = chroma * (1 - Math.abs((hue % 2) - 1));
    const sector = Math.floor(hue) % 6;
    const [r1, g1, b1] =
      sector === 0 ? [chroma, x, 0] : sector === 1 ? [x, chroma, 0] : sector === 2 ? [0, chroma, x]
      : sector === 3 ? [0, x, chroma] : sector === 4 ? [x, 0, chroma] : [chroma, 0, x];
    const m = value - chroma;
    colours.push([encodedToLinear(r1 + m), encodedToLinear(g1 + m), encodedToLinear(b1 + m)]);
  }
  for (let i = 0; i < cols; i++) {
    const lightness = cols === 1 ? 50 : 96 - (76 * i) / (cols - 1);
    const y = Math.pow((lightness + 16) / 116, 3); // CIE 15 inverse for L* > 8
    colours.push([y, y, y]);
  }
  return colours;
}

function encodedToLinear(v: number): number {
  return v <= 0.04045 ? v / 12.92 : Math.pow((v + 0.055) / 1.055, 2.4);
}

/** Layout of the chart's grid inside a frame: 6 % margins, patches inset 5 % of their cell. */
export function syntheticChartLayout(width: number, height: number, cols: number, rows: number) {
  const marginX = Math.round(width * 0.06);
  const marginY = Math.round(height * 0.06);
  const chartRegion: Region = { x: marginX, y: marginY, w: width - 2 * marginX, h: height - 2 * marginY };
  const rects: Region[] = [];
  for (let row = 0; row < rows; row++) {
    for (let col = 0; col < cols; col++) {
      const x0 = chartRegion.x + Math.round((chartRegion.w * col) / cols);
      const x1 = chartRegion.x + Math.round((chartRegion.w * (col + 1)) / cols);
      const y0 = chartRegion.y + Math.round((chartRegion.h * row) / rows);
      const y1 = chartRegion.y + Math.round((chartRegion.h * (row + 1)) / rows);
      const insetX = Math.round((x1 - x0) * 0.05);
      const insetY = Math.round((y1 - y0) * 0.05);
      rects.push({ x: x0 + insetX, y: y0 + insetY, w: x1 - x0 - 2 * insetX, h: y1 - y0 - 2 * insetY });
    }
  }
  return { chartRegion, rects };
}

/** Table for linear 0…1 → encoded 0…1 with linear interpolation; max error ≈ 1e-7 (checked in tests). */
const ENCODE_STEPS = 65536;
const encodeTables = new Map<Transfer, Float64Array>();
function encodeTable(transfer: Transfer): Float64Array {
  let table = encodeTables.get(transfer);
  if (!table) {
    const encode = transfer === 'bt709' ? bt709Oetf : linearToSrgb;
    table = new Float64Array(ENCODE_STEPS + 2);
    for (let i = 0; i <= ENCODE_STEPS; i++) table[i] = encode(i / ENCODE_STEPS);
    table[ENCODE_STEPS + 1] = table[ENCODE_STEPS];
    encodeTables.set(transfer, table);
  }
  return table;
}

/**
 * Generate a synthetic chart frame (invented data, see the file comment): returns the frame and
 * the chart's geometry. Default: 960×540, 16-bit, sRGB-encoded, 6×4 patches, no noise.
 */
export function synthChartFrame(options: SynthChartOptions = {}): SyntheticChart {
  const width = options.width ?? 960;
  const height = options.height ?? 540;
  const layout = options.layout ?? 'chart';
  const cols = options.cols ?? 6;
  const rows = options.rows ?? 4;
  const noiseSigma = options.noiseSigma ?? 0;
  const chromaSigma = options.chromaNoiseSigma ?? 0;
  const offset = options.exposureOffsetStops ?? 0;
  const recover = options.recover ?? true;
  const captureBits = options.captureBitDepth ?? 12;
  const bitDepth = options.bitDepth ?? 16;
  const transfer = options.transfer ?? 'srgb';
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    throw new InvalidInputError('width and height must be positive integers', 'width');
  }
  if (!Number.isInteger(cols) || !Number.isInteger(rows) || cols < 1 || rows < 1 || cols * rows > 4096) {
    throw new InvalidInputError('cols and rows must be positive integers, at most 4096 patches', 'cols');
  }
  if (!(noiseSigma >= 0) || !(chromaSigma >= 0)) throw new InvalidInputError('noise σ must be ≥ 0', 'noiseSigma');
  if (!Number.isFinite(offset)) throw new InvalidInputError('exposure offset must be finite', 'exposureOffsetStops');

  // Scene: a colour index per pixel, so the pixel loop is one table read.
  const sceneIndex = new Uint16Array(width * height);
  const palette: Array<readonly [number, number, number]> = [];
  const patches: SyntheticPatch[] = [];
  let chartRegion: Region;
  if (layout === 'flat') {
    palette.push(options.flatLinearRgb ?? [0.18, 0.18, 0.18]);
    chartRegion = { x: 0, y: 0, w: width, h: height };
    patches.push({ col: 0, row: 0, rect: chartRegion, linearRgb: palette[0] });
  } else {
    palette.push([SYNTH_SURROUND_LINEAR, SYNTH_SURROUND_LINEAR, SYNTH_SURROUND_LINEAR]);
    const colours = syntheticPatchColours(cols, rows);
    const geometry = syntheticChartLayout(width, height, cols, rows);
    chartRegion = geometry.chartRegion;
    geometry.rects.forEach((rect, i) => {
      palette.push(colours[i]);
      patches.push({ col: i % cols, row: Math.floor(i / cols), rect, linearRgb: colours[i] });
      for (let y = rect.y; y < rect.y + rect.h; y++) sceneIndex.fill(i + 1, y * width + rect.x, y * width + rect.x + rect.w);
    });
  }

  const gain = Math.pow(2, offset);
  const ungain = recover ? 1 / gain : 1;
  const levels = captureBits > 0 ? Math.pow(2, captureBits) - 1 : 0;
  const outMax = bitDepth === 16 ? 65535 : 255;
  const table = encodeTable(transfer);
  const gaussian = seededGaussian(options.seed ?? 1);
  const data = bitDepth === 16 ? new Uint16Array(width * height * 3) : new Uint8Array(width * height * 3);
  const flatPalette = new Float64Array(palette.length * 3);
  palette.forEach((c, i) => flatPalette.set(c, i * 3));

  for (let p = 0, o = 0; p < sceneIndex.length; p++, o += 3) {
    const base = sceneIndex[p] * 3;
    const nLuma = noiseSigma > 0 ? noiseSigma * gaussian() : 0;
    for (let c = 0; c < 3; c++) {
      let v = flatPalette[base + c] * gain + nLuma + (chromaSigma > 0 ? chromaSigma * gaussian() : 0);
      v = v < 0 ? 0 : v > 1 ? 1 : v;
      if (levels > 0) v = Math.round(v * levels) / levels;
      v *= ungain;
      if (v > 1) v = 1;
      const t = v * ENCODE_STEPS;
      const i = t | 0;
      const encoded = table[i] + (table[i + 1] - table[i]) * (t - i);
      data[o + c] = Math.round(encoded * outMax);
    }
  }

  return { frame: { width, height, channels: 3, bitDepth, data }, chartRegion, cols, rows, patches };
}
