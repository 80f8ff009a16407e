import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  ColorSpace,
  Lab,
  Lab_D65,
  XYZ_D50,
  XYZ_D65,
  deltaE2000 as referenceDeltaE2000,
  sRGB,
  sRGB_Linear,
  to,
} from 'colorjs.io/fn';
import {
  LUMA_709,
  bt709InverseOetf,
  bt709Oetf,
  deltaE2000,
  linearToSrgb,
  rgbToXyz,
  srgb8ToLab,
  srgbToLinear,
  xyzToLab,
  type Vec3,
} from './color.ts';

// The reference library is used in tests only (issue 6: "keep the reference library for tests").
for (const space of [XYZ_D65, XYZ_D50, sRGB_Linear, sRGB, Lab_D65, Lab]) ColorSpace.register(space);

/** Deterministic uniform numbers for the cross-checks, so a failure is reproducible. */
function seededUniform(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('CIEDE2000 against the published test data', () => {
  // Sharma, G., Wu, W., Dalal, E. N. (2005), "The CIEDE2000 color-difference formula: implementation
  // notes, supplementary test data, and mathematical observations", Color Research & Application
  // 30(1), 21–30, Table 1 — all 34 pairs: [L1, a1, b1, L2, a2, b2, ΔE00], as printed (4 decimals).
  const SHARMA_2005_TABLE_1: readonly (readonly number[])[] = [
    [50.0, 2.6772, -79.7751, 50.0, 0.0, -82.7485, 2.0425],
    [50.0, 3.1571, -77.2803, 50.0, 0.0, -82.7485, 2.8615],
    [50.0, 2.8361, -74.02, 50.0, 0.0, -82.7485, 3.4412],
    [50.0, -1.3802, -84.2814, 50.0, 0.0, -82.7485, 1.0],
    [50.0, -1.1848, -84.8006, 50.0, 0.0, -82.7485, 1.0],
    [50.0, -0.9009, -85.5211, 50.0, 0.0, -82.7485, 1.0],
    [50.0, 0.0, 0.0, 50.0, -1.0, 2.0, 2.3669],
    [50.0, -1.0, 2.0, 50.0, 0.0, 0.0, 2.3669],
    [50.0, 2.49, -0.001, 50.0, -2.49, 0.0009, 7.1792],
    [50.0, 2.49, -0.001, 50.0, -2.49, 0.001, 7.1792],
    [50.0, 2.49, -0.001, 50.0, -2.49, 0.0011, 7.2195],
    [50.0, 2.49, -0.001, 50.0, -2.49, 0.0012, 7.2195],
    [50.0, -0.001, 2.49, 50.0, 0.0009, -2.49, 4.8045],
    [50.0, -0.001, 2.49, 50.0, 0.001, -2.49, 4.8045],
    [50.0, -0.001, 2.49, 50.0, 0.0011, -2.49, 4.7461],
    [50.0, 2.5, 0.0, 50.0, 0.0, -2.5, 4.3065],
    [50.0, 2.5, 0.0, 73.0, 25.0, -18.0, 27.1492],
    [50.0, 2.5, 0.0, 61.0, -5.0, 29.0, 22.8977],
    [50.0, 2.5, 0.0, 56.0, -27.0, -3.0, 31.903],
    [50.0, 2.5, 0.0, 58.0, 24.0, 15.0, 19.4535],
    [50.0, 2.5, 0.0, 50.0, 3.1736, 0.5854, 1.0],
    [50.0, 2.5, 0.0, 50.0, 3.2972, 0.0, 1.0],
    [50.0, 2.5, 0.0, 50.0, 1.8634, 0.5757, 1.0],
    [50.0, 2.5, 0.0, 50.0, 3.2592, 0.335, 1.0],
    [60.2574, -34.0099, 36.2677, 60.4626, -34.1751, 39.4387, 1.2644],
    [63.0109, -31.0961, -5.8663, 62.8187, -29.7946, -4.0864, 1.263],
    [61.2901, 3.7196, -5.3901, 61.4292, 2.248, -4.962, 1.8731],
    [35.0831, -44.1164, 3.7933, 35.0232, -40.0716, 1.5901, 1.8645],
    [22.7233, 20.0904, -46.694, 23.0331, 14.973, -42.5619, 2.0373],
    [36.4612, 47.858, 18.3852, 36.2715, 50.5065, 21.2231, 1.4146],
    [90.8027, -2.0831, 1.441, 91.1528, -1.6435, 0.0447, 1.4441],
    [90.9257, -0.5406, -0.9208, 88.6381, -0.8985, -0.7239, 1.5381],
    [6.7747, -0.2908, -2.4247, 5.8714, -0.0985, -2.2286, 0.6377],
    [2.0776, 0.0795, -1.135, 0.9033, -0.0636, -0.5514, 0.9082],
  ];

  it('has all 34 pairs of the published table', () => {
    expect(SHARMA_2005_TABLE_1).toHaveLength(34);
  });

  it.each(SHARMA_2005_TABLE_1.map((row, i) => [i + 1, row] as const))(
    'pair %i matches Sharma, Wu & Dalal (2005) Table 1 to 1e-4, in both orders',
    (_pair, [L1, a1, b1, L2, a2, b2, expected]) => {
      // Sharma, Wu & Dalal (2005) Table 1; the table prints 4 decimals, so 1e-4 is the honest bound.
      expect(Math.abs(deltaE2000([L1, a1, b1], [L2, a2, b2]) - expected)).toBeLessThanOrEqual(1e-4);
      expect(Math.abs(deltaE2000([L2, a2, b2], [L1, a1, b1]) - expected)).toBeLessThanOrEqual(1e-4);
    },
  );
});

describe('sRGB transfer (IEC 61966-2-1)', () => {
  it('decodes with the 0.04045 threshold and the 2.4 power segment', () => {
    // IEC 61966-2-1 §5.2: V ≤ 0.04045 → V / 12.92; else ((V + 0.055) / 1.055)^2.4. Values worked by hand.
    expect(srgbToLinear(0)).toBe(0);
    expect(srgbToLinear(1)).toBeCloseTo(1, 12);
    expect(srgbToLinear(0.04045)).toBeCloseTo(0.04045 / 12.92, 12); // linear segment at the threshold
    expect(srgbToLinear(0.02)).toBeCloseTo(0.02 / 12.92, 12);
    expect(srgbToLinear(0.5)).toBeCloseTo(0.21404, 5); // IEC 61966-2-1 power segment, 0.5 → 0.21404
    expect(srgbToLinear(128 / 255)).toBeCloseTo(0.21586, 5); // 8-bit code 128, same formula
  });

  it('encodes with the 0.0031308 threshold', () => {
    // IEC 61966-2-1 §5.3: L ≤ 0.0031308 → 12.92 L; else 1.055 L^(1/2.4) − 0.055.
    expect(linearToSrgb(0.0031308)).toBeCloseTo(0.04045, 5); // both segments meet at the threshold
    expect(linearToSrgb(0.001)).toBeCloseTo(0.01292, 12);
    expect(linearToSrgb(0.21404114)).toBeCloseTo(0.5, 7);
    expect(linearToSrgb(1)).toBeCloseTo(1, 12);
  });

  it('the two segments are continuous at the thresholds (IEC 61966-2-1 fixed the 1996 draft rounding)', () => {
    // IEC 61966-2-1: the pair 0.04045 / 0.0031308 makes the segments meet to about 1e-7.
    const below = 0.04045 / 12.92;
    const above = Math.pow((0.04045 + 0.055) / 1.055, 2.4);
    expect(Math.abs(above - below)).toBeLessThan(1e-7);
  });
});

describe('BT.709 OETF (ITU-R BT.709-6 part 1, item 1.2)', () => {
  it('uses the 4.5 linear segment below 0.018 and the 1.099 L^0.45 − 0.099 segment above', () => {
    // ITU-R BT.709-6: V = 4.500 L for L < 0.018; V = 1.099 L^0.45 − 0.099 for L ≥ 0.018.
    expect(bt709Oetf(0)).toBe(0);
    expect(bt709Oetf(0.01)).toBeCloseTo(0.045, 12); // 4.5 · 0.01
    expect(bt709Oetf(0.017999)).toBeCloseTo(4.5 * 0.017999, 12);
    expect(bt709Oetf(0.018)).toBeCloseTo(0.081, 3); // 0.018 → 0.081 (segments meet to 3 decimals)
    expect(bt709Oetf(1)).toBeCloseTo(1, 12); // 1.099 − 0.099
    // 0.18 → 0.4090077…, the worked value in the colour-science library's BT.709 OETF docs.
    expect(bt709Oetf(0.18)).toBeCloseTo(0.4090077, 7);
  });

  it('inverts both segments', () => {
    // ITU-R BT.709-6 solved for L.
    expect(bt709InverseOetf(0.045)).toBeCloseTo(0.01, 12);
    expect(bt709InverseOetf(0.409007728864150)).toBeCloseTo(0.18, 10);
    expect(bt709InverseOetf(1)).toBeCloseTo(1, 12);
  });
});

describe('linear RGB → XYZ (sRGB / BT.709 primaries, D65)', () => {
  it('rounds to the four-decimal matrix printed in IEC 61966-2-1', () => {
    // IEC 61966-2-1:1999 §5.2 matrix (as reproduced in public references).
    const iec = [
      [0.4124, 0.3576, 0.1805],
      [0.2126, 0.7152, 0.0722],
      [0.0193, 0.1192, 0.9505],
    ];
    const columns = [rgbToXyz([1, 0, 0]), rgbToXyz([0, 1, 0]), rgbToXyz([0, 0, 1])];
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) {
      expect(Math.round(columns[c][r] * 1e4) / 1e4).toBeCloseTo(iec[r][c], 10);
    }
  });

  it('maps white to the D65 white with Y = 1 and the Y row to the BT.709 luma weights', () => {
    const white = rgbToXyz([1, 1, 1]);
    // D65 as xy = (0.3127, 0.3290) (IEC 61966-2-1 table 1; ITU-R BT.709-6 item 1.4).
    expect(white[0]).toBeCloseTo(0.3127 / 0.329, 12);
    expect(white[1]).toBeCloseTo(1, 12);
    expect(white[2]).toBeCloseTo((1 - 0.3127 - 0.329) / 0.329, 12);
    // ITU-R BT.709-6 item 3.2: 0.2126 R + 0.7152 G + 0.0722 B.
    expect(rgbToXyz([1, 0, 0])[1]).toBeCloseTo(LUMA_709.r, 4);
    expect(rgbToXyz([0, 1, 0])[1]).toBeCloseTo(LUMA_709.g, 4);
    expect(rgbToXyz([0, 0, 1])[1]).toBeCloseTo(LUMA_709.b, 4);
    expect(LUMA_709.r + LUMA_709.g + LUMA_709.b).toBeCloseTo(1, 12);
  });
});

describe('XYZ → CIELAB (CIE 15, D65 white)', () => {
  it('puts the D65 white at (100, 0, 0) and black at (0, 0, 0)', () => {
    // CIE 15:2004 §8.2.1.1: L* = 116 f(Y/Yn) − 16, a* = 500 (f(X/Xn) − f(Y/Yn)), b* = 200 (f(Y/Yn) − f(Z/Zn)).
    const white = xyzToLab(rgbToXyz([1, 1, 1]));
    expect(white[0]).toBeCloseTo(100, 10);
    expect(white[1]).toBeCloseTo(0, 10);
    expect(white[2]).toBeCloseTo(0, 10);
    expect(xyzToLab([0, 0, 0]).map((v) => v + 0)).toEqual([0, 0, 0]);
  });

  it('gives mid grey its lightness (Y = 0.18 → L* 49.496; Y = 0.184187 → L* 50)', () => {
    // CIE 15 formula worked by hand: 116 · 0.18^(1/3) − 16 = 49.4961; ((50 + 16) / 116)^3 = 0.184187.
    const grey18 = xyzToLab(rgbToXyz([0.18, 0.18, 0.18]));
    expect(grey18[0]).toBeCloseTo(49.4961, 4);
    expect(grey18[1]).toBeCloseTo(0, 10);
    expect(grey18[2]).toBeCloseTo(0, 10);
    const y50 = Math.pow(66 / 116, 3);
    expect(y50).toBeCloseTo(0.184187, 6);
    expect(xyzToLab(rgbToXyz([y50, y50, y50]))[0]).toBeCloseTo(50, 9);
  });

  it('uses the linear segment below (6/29)^3 with slope κ = 24389/27 ≈ 903.3 on L*', () => {
    // CIE 15:2004 §8.2.1.1 (L* = 903.3 Y/Yn for Y/Yn ≤ 0.008856).
    expect(xyzToLab(rgbToXyz([0.008, 0.008, 0.008]))[0]).toBeCloseTo((24389 / 27) * 0.008, 8);
    expect(xyzToLab(rgbToXyz([0.008, 0.008, 0.008]))[0]).toBeCloseTo(903.3 * 0.008, 2);
  });

  it('srgb8ToLab puts sRGB white at (100, 0, 0) and 8-bit (119,119,119) near L* 50', () => {
    // IEC 61966-2-1 decoding then CIE 15: 119/255 → Y 0.18447 → L* 50.03 (worked by hand).
    expect(srgb8ToLab(255, 255, 255)[0]).toBeCloseTo(100, 10);
    expect(srgb8ToLab(119, 119, 119)[0]).toBeCloseTo(50.03, 2);
  });
});

describe('cross-check against colorjs.io (independent reference library), 2000 random colours', () => {
  const N = 2000;

  it('deltaE2000 agrees on random L*a*b* pairs to 1e-9', () => {
    const u = seededUniform(20050101);
    let worst = 0;
    for (let i = 0; i < N; i++) {
      const lab1: Vec3 = [u() * 100, u() * 200 - 100, u() * 200 - 100];
      // Half the pairs near each other (the range readouts live in), half anywhere.
      const lab2: Vec3 =
        i % 2 === 0
          ? [lab1[0] + (u() - 0.5) * 6, lab1[1] + (u() - 0.5) * 6, lab1[2] + (u() - 0.5) * 6]
          : [u() * 100, u() * 200 - 100, u() * 200 - 100];
      // colorjs.io's deltaE2000 reads coordinates in its "lab" space; the formula is the same for any white.
      const expected = referenceDeltaE2000(
        { space: Lab, coords: lab1, alpha: 1 },
        { space: Lab, coords: lab2, alpha: 1 },
      );
      worst = Math.max(worst, Math.abs(deltaE2000(lab1, lab2) - expected));
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('deltaE2000 agrees near opposite hues, where the mean-hue rule switches branch', () => {
    // Sharma et al. (2005) pairs 9–16 probe this discontinuity; here 1000 more pairs from 0.0001°
    // to 1° either side of 180° apart, against colorjs.io.
    const u = seededUniform(180);
    let worst = 0;
    for (let i = 0; i < 1000; i++) {
      const hue1 = u() * 2 * Math.PI;
      const miss = (u() < 0.5 ? -1 : 1) * Math.pow(10, -4 + 4 * u()) * (Math.PI / 180);
      const hue2 = hue1 + Math.PI + miss;
      const chroma1 = 0.5 + u() * 60, chroma2 = 0.5 + u() * 60;
      const lab1: Vec3 = [20 + u() * 60, chroma1 * Math.cos(hue1), chroma1 * Math.sin(hue1)];
      const lab2: Vec3 = [20 + u() * 60, chroma2 * Math.cos(hue2), chroma2 * Math.sin(hue2)];
      const expected = referenceDeltaE2000(
        { space: Lab, coords: lab1, alpha: 1 },
        { space: Lab, coords: lab2, alpha: 1 },
      );
      worst = Math.max(worst, Math.abs(deltaE2000(lab1, lab2) - expected));
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('rgbToXyz and xyzToLab agree with colorjs.io sRGB → XYZ D65 → Lab D65 to 1e-9', () => {
    const u = seededUniform(61966);
    let worstXyz = 0;
    let worstLab = 0;
    for (let i = 0; i < N; i++) {
      const encoded: Vec3 = [u(), u(), u()];
      const linear: Vec3 = [srgbToLinear(encoded[0]), srgbToLinear(encoded[1]), srgbToLinear(encoded[2])];
      const colour = { space: sRGB, coords: encoded, alpha: 1 };
      const refXyz = to(colour, XYZ_D65).coords as number[];
      const refLab = to(colour, Lab_D65).coords as number[];
      const xyz = rgbToXyz(linear);
      const lab = xyzToLab(xyz);
      for (let k = 0; k < 3; k++) {
        worstXyz = Math.max(worstXyz, Math.abs(xyz[k] - refXyz[k]));
        worstLab = Math.max(worstLab, Math.abs(lab[k] - refLab[k]));
      }
    }
    expect(worstXyz).toBeLessThan(1e-9);
    expect(worstLab).toBeLessThan(1e-9);
  });

  it('srgb8ToLab agrees with colorjs.io on every 8-bit grey and random 8-bit colours', () => {
    const u = seededUniform(255);
    const codes: Vec3[] = [];
    for (let v = 0; v < 256; v++) codes.push([v, v, v]);
    for (let i = 0; i < N; i++) codes.push([Math.floor(u() * 256), Math.floor(u() * 256), Math.floor(u() * 256)]);
    let worst = 0;
    for (const [r, g, b] of codes) {
      const ref = to({ space: sRGB, coords: [r / 255, g / 255, b / 255], alpha: 1 }, Lab_D65).coords as number[];
      const lab = srgb8ToLab(r, g, b);
      for (let k = 0; k < 3; k++) worst = Math.max(worst, Math.abs(lab[k] - ref[k]));
    }
    expect(worst).toBeLessThan(1e-9);
  });
});

describe('properties (fast-check)', () => {
  const labArb = fc.tuple(
    fc.double({ min: 0, max: 100, noNaN: true }),
    fc.double({ min: -128, max: 128, noNaN: true }),
    fc.double({ min: -128, max: 128, noNaN: true }),
  );

  it('deltaE2000 is symmetric', () => {
    // CIE 142-2001 defines ΔE00 symmetrically in the two samples; Sharma et al. pairs 7/8 test it.
    fc.assert(
      fc.property(labArb, labArb, (p, q) => Math.abs(deltaE2000(p, q) - deltaE2000(q, p)) < 1e-9),
    );
  });

  it('deltaE2000 is zero for identical colours, never negative, and positive for distinct colours', () => {
    fc.assert(fc.property(labArb, (p) => deltaE2000(p, [p[0], p[1], p[2]]) === 0));
    fc.assert(
      fc.property(labArb, labArb, (p, q) => {
        const d = deltaE2000(p, q);
        // Differences below ~1e-150 underflow in the squares, so "distinct" means by more than 1e-6.
        const distinct = Math.max(Math.abs(p[0] - q[0]), Math.abs(p[1] - q[1]), Math.abs(p[2] - q[2])) > 1e-6;
        return d >= 0 && (!distinct || d > 0);
      }),
    );
  });

  it('sRGB decode then encode is the identity on 0…1', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (v) => Math.abs(linearToSrgb(srgbToLinear(v)) - v) < 1e-12),
    );
  });

  it('BT.709 OETF then its inverse is the identity on 0…1', () => {
    // ITU-R BT.709-6: L < 0.018 encodes below 0.081 and L ≥ 0.018 encodes at ≥ 0.0813, so each
    // signal decodes through the segment that produced it.
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (l) => Math.abs(bt709InverseOetf(bt709Oetf(l)) - l) < 1e-12),
    );
  });

  it('writes into a caller buffer without allocating a new one', () => {
    const buf = new Float64Array(3);
    expect(rgbToXyz([0.2, 0.3, 0.4], buf)).toBe(buf);
    expect(xyzToLab(buf, buf)).toBe(buf);
    expect(srgb8ToLab(10, 20, 30, buf)).toBe(buf);
  });
});
