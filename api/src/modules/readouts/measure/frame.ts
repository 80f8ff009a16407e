/**
 * Frames for readouts: decoding with sharp into interleaved RGB typed arrays, regions, and the
 * linearisation look-up tables the hot loops use (issue 6).
 */
import sharp from 'sharp';
import { InvalidInputError } from '@midgray/shared/errors';
import { bt709InverseOetf, srgbToLinear } from '@midgray/shared/color';

/** A decoded frame: interleaved R,G,B code values, row-major, no alpha; full-range codes 0…2^bitDepth − 1. */
export interface Frame {
  width: number;
  height: number;
  channels: 3;
  bitDepth: 8 | 16;
  data: Uint8Array | Uint16Array;
}

/** A rectangle of the frame in pixels: left/top corner (x, y), width w and height h. */
export interface Region {
  x: number;
  y: number;
  w: number;
  h: number;
}

/**
 * How the code values were encoded. `srgb`: IEC 61966-2-1 (frame grabs, PNG's default);
 * `bt709`: the ITU-R BT.709-6 OETF (a frame extracted from BT.709 video). Both share the
 * BT.709 primaries and D65 white, so only the linearisation differs.
 */
export type Transfer = 'srgb' | 'bt709';

/** Largest code value of a frame: 255 or 65535. */
export function maxCode(frame: Pick<Frame, 'bitDepth'>): number {
  return frame.bitDepth === 16 ? 65535 : 255;
}

/**
 * Decode an image file or buffer to a `Frame`. 16-bit images (PNG from the frame extractor)
 * stay 16-bit; everything else becomes 8-bit. Grey images are expanded to RGB and alpha is
 * dropped. Note sharp must be asked for `rgb16` explicitly or it reduces to 8-bit sRGB.
 */
export async function decodeFrame(input: string | Buffer): Promise<Frame> {
  const image = sharp(input, { limitInputPixels: 16384 * 16384 });
  const meta = await image.metadata();
  const sixteen = meta.depth === 'ushort' || meta.depth === 'short' || (meta.bitsPerSample ?? 8) > 8;
  const pipeline = image.removeAlpha();
  const { data, info } = sixteen
    ? await pipeline.toColourspace('rgb16').raw({ depth: 'ushort' }).toBuffer({ resolveWithObject: true })
    : await pipeline.toColourspace('srgb').raw().toBuffer({ resolveWithObject: true });
  if (info.channels !== 3) {
    throw new InvalidInputError(`expected 3 colour channels after decoding, got ${info.channels}`, 'frame');
  }
  if (!sixteen) {
    return { width: info.width, height: info.height, channels: 3, bitDepth: 8, data: new Uint8Array(data.buffer, data.byteOffset, data.length) };
  }
  // A Uint16Array view needs an even byte offset; sharp's large buffers start at 0, copy otherwise.
  const bytes = data.byteOffset % 2 === 0 ? data : Buffer.from(data);
  return {
    width: info.width,
    height: info.height,
    channels: 3,
    bitDepth: 16,
    data: new Uint16Array(bytes.buffer, bytes.byteOffset, bytes.length / 2),
  };
}

/**
 * The default measuring region, "the centre tenth": a rectangle one tenth of the frame's width
 * and one tenth of its height (so 1 % of its area), centred; at least 1×1 pixel.
 */
export function centreTenthRegion(width: number, height: number): Region {
  const w = Math.max(1, Math.round(width / 10));
  const h = Math.max(1, Math.round(height / 10));
  return { x: Math.floor((width - w) / 2), y: Math.floor((height - h) / 2), w, h };
}

/** The region checked against the frame: integer pixels, inside the frame, non-empty (else 422). */
export function checkedRegion(frame: Pick<Frame, 'width' | 'height'>, region: Region): Region {
  const { x, y, w, h } = region;
  if (![x, y, w, h].every(Number.isInteger)) throw new InvalidInputError('region must be whole pixels', 'region');
  if (w < 1 || h < 1) throw new InvalidInputError('region must be at least 1×1 pixel', 'region');
  if (x < 0 || y < 0 || x + w > frame.width || y + h > frame.height) {
    throw new InvalidInputError(
      `region ${w}×${h} at (${x}, ${y}) does not fit the ${frame.width}×${frame.height} frame`,
      'region',
    );
  }
  return { x, y, w, h };
}

/** Throws unless `data` holds width × height × 3 codes of the stated depth. */
export function checkFrame(frame: Frame): void {
  const expected = frame.width * frame.height * 3;
  if (frame.width < 1 || frame.height < 1 || frame.data.length !== expected) {
    throw new InvalidInputError(`frame data holds ${frame.data.length} values, expected ${expected}`, 'frame');
  }
  if ((frame.bitDepth === 16) !== frame.data instanceof Uint16Array) {
    throw new InvalidInputError('frame bitDepth does not match its array type', 'frame');
  }
}

const lutCache = new Map<string, Float64Array>();

/**
 * Code value → linear light (0…1) for every code of the depth: 256 or 65536 entries, built once
 * per (depth, transfer) so the pixel loops do an array read instead of a power function.
 */
export function linearLut(bitDepth: 8 | 16, transfer: Transfer): Float64Array {
  const key = `${bitDepth}:${transfer}`;
  let lut = lutCache.get(key);
  if (!lut) {
    const size = bitDepth === 16 ? 65536 : 256;
    const decode = transfer === 'bt709' ? bt709InverseOetf : srgbToLinear;
    lut = new Float64Array(size);
    for (let code = 0; code < size; code++) lut[code] = decode(code / (size - 1));
    lutCache.set(key, lut);
  }
  return lut;
}
