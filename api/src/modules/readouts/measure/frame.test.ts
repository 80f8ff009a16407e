import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { InvalidInputError } from '@midgray/shared/errors';
import { bt709InverseOetf, srgbToLinear } from '@midgray/shared/color';
import { centreTenthRegion, checkedRegion, decodeFrame, linearLut } from './frame.ts';

describe('decodeFrame', () => {
  it('when given a 16-bit PNG, then it returns every code exactly as 16-bit RGB', async () => {
    const codes = new Uint16Array([0, 1, 2, 1000, 30000, 65535, 257, 512, 40000, 65534, 65535, 12345]);
    const png = await sharp(codes, { raw: { width: 2, height: 2, channels: 3 } }).toColourspace('rgb16').png().toBuffer();
    const frame = await decodeFrame(png);
    expect(frame).toMatchObject({ width: 2, height: 2, channels: 3, bitDepth: 16 });
    expect(frame.data).toBeInstanceOf(Uint16Array);
    expect(Array.from(frame.data)).toEqual(Array.from(codes));
  });

  it('when given an 8-bit PNG, then it returns 8-bit RGB', async () => {
    const codes = new Uint8Array([0, 128, 255, 10, 20, 30]);
    const png = await sharp(codes, { raw: { width: 2, height: 1, channels: 3 } }).png().toBuffer();
    const frame = await decodeFrame(png);
    expect(frame).toMatchObject({ width: 2, height: 1, bitDepth: 8 });
    expect(Array.from(frame.data)).toEqual([0, 128, 255, 10, 20, 30]);
  });

  it('when the PNG has alpha, then alpha is dropped', async () => {
    const rgba = new Uint8Array([10, 20, 30, 40, 50, 60, 70, 255]);
    const png = await sharp(rgba, { raw: { width: 2, height: 1, channels: 4 } }).png().toBuffer();
    const frame = await decodeFrame(png);
    expect(Array.from(frame.data)).toEqual([10, 20, 30, 50, 60, 70]);
  });

  it('when the PNG is 16-bit grey, then it is expanded to three equal channels', async () => {
    const grey = new Uint16Array([0, 20000, 65535]);
    const png = await sharp(grey, { raw: { width: 3, height: 1, channels: 1 } }).toColourspace('grey16').png().toBuffer();
    const frame = await decodeFrame(png);
    expect(frame.bitDepth).toBe(16);
    expect(Array.from(frame.data)).toEqual([0, 0, 0, 20000, 20000, 20000, 65535, 65535, 65535]);
  });
});

describe('regions', () => {
  it('the default region is the centre tenth: 1/10 of width and height, centred', () => {
    expect(centreTenthRegion(3840, 2160)).toEqual({ x: 1728, y: 972, w: 384, h: 216 });
    expect(centreTenthRegion(1920, 1080)).toEqual({ x: 864, y: 486, w: 192, h: 108 });
    expect(centreTenthRegion(5, 5)).toEqual({ x: 2, y: 2, w: 1, h: 1 });
  });

  it('rejects regions outside the frame, empty or fractional, as invalid input', () => {
    const frame = { width: 100, height: 50 };
    expect(checkedRegion(frame, { x: 0, y: 0, w: 100, h: 50 })).toEqual({ x: 0, y: 0, w: 100, h: 50 });
    for (const bad of [
      { x: 1, y: 0, w: 100, h: 50 },
      { x: 0, y: 0, w: 0, h: 5 },
      { x: -1, y: 0, w: 5, h: 5 },
      { x: 0.5, y: 0, w: 5, h: 5 },
    ]) {
      expect(() => checkedRegion(frame, bad)).toThrow(InvalidInputError);
    }
  });
});

describe('linearisation tables', () => {
  it('hold the IEC 61966-2-1 and ITU-R BT.709-6 decodings of every code', () => {
    const srgb16 = linearLut(16, 'srgb');
    const bt16 = linearLut(16, 'bt709');
    expect(srgb16).toHaveLength(65536);
    expect(linearLut(8, 'srgb')).toHaveLength(256);
    expect(srgb16[0]).toBe(0);
    expect(srgb16[65535]).toBeCloseTo(1, 12);
    expect(bt16[65535]).toBeCloseTo(1, 12);
    // IEC 61966-2-1: 0.5 → 0.21404; code 32768 is 0.500008, a hair above.
    expect(srgb16[32768]).toBeCloseTo(0.21404, 4);
    for (const code of [1, 100, 2651, 2652, 5308, 5309, 40000, 65534]) {
      expect(srgb16[code]).toBe(srgbToLinear(code / 65535));
      expect(bt16[code]).toBe(bt709InverseOetf(code / 65535));
    }
    expect(linearLut(16, 'srgb')).toBe(srgb16); // built once
  });
});
