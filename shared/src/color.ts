/**
 * Colour maths for readouts (issue 6): transfer functions, linear RGB → XYZ → CIELAB, CIEDE2000.
 *
 * Conventions, fixed here once:
 * - Signals (encoded and linear) are relative, 0…1 for the nominal range; nothing is clamped.
 * - XYZ is relative with **Y of the reference white = 1** (not 100).
 * - The white point is D65 as the sRGB / BT.709 specifications give it, chromaticity
 *   x = 0.3127, y = 0.3290. The RGB → XYZ matrix and the CIELAB reference white both use it, so
 *   RGB white maps to exactly L* = 100, a* = b* = 0.
 * - L*a*b* triples are `[L*, a*, b*]` (L* 0…100).
 *
 * The per-pixel functions take an optional `out` so hot loops can reuse one buffer and
 * allocate nothing; without it they return a new array.
 */

/** Three numbers: an RGB, XYZ or L*a*b* triple. */
export type Vec3 = [number, number, number];
/** Anything indexable that holds a triple (array, typed array). */
export type Vec3Like = ArrayLike<number>;
/** Writable triple buffer, for `out` parameters. */
export type Vec3Out = { [index: number]: number; length: number };

/** BT.709 luma / luminance weights (ITU-R BT.709-6, part 1, item 3.2): unitless, sum to 1. */
export const LUMA_709 = Object.freeze({ r: 0.2126, g: 0.7152, b: 0.0722 });

// ---------------------------------------------------------------------------------------------
// Transfer functions
// ---------------------------------------------------------------------------------------------

/** sRGB decoding (IEC 61966-2-1): encoded value 0…1 → linear light 0…1. */
export function srgbToLinear(encoded: number): number {
  return encoded <= 0.04045 ? encoded / 12.92 : Math.pow((encoded + 0.055) / 1.055, 2.4);
}

/** sRGB encoding (IEC 61966-2-1): linear light 0…1 → encoded value 0…1. */
export function linearToSrgb(linear: number): number {
  return linear <= 0.0031308 ? linear * 12.92 : 1.055 * Math.pow(linear, 1 / 2.4) - 0.055;
}

/** BT.709 OETF (ITU-R BT.709-6, part 1, item 1.2): scene linear light 0…1 → signal 0…1. */
export function bt709Oetf(linear: number): number {
  return linear < 0.018 ? 4.5 * linear : 1.099 * Math.pow(linear, 0.45) - 0.099;
}

/**
 * Inverse of the BT.709 OETF: signal 0…1 → scene linear light 0…1.
 * The published segments meet at L = 0.018 only to three decimals (4.5·0.018 = 0.081 against
 * 1.099·0.018^0.45 − 0.099 ≈ 0.0813), so the split is taken at V = 0.081 as the standard writes it.
 */
export function bt709InverseOetf(signal: number): number {
  return signal < 0.081 ? signal / 4.5 : Math.pow((signal + 0.099) / 1.099, 1 / 0.45);
}

// ---------------------------------------------------------------------------------------------
// Linear RGB (sRGB / BT.709 primaries, D65) → XYZ
// ---------------------------------------------------------------------------------------------

/** sRGB / BT.709 primaries and white (IEC 61966-2-1 table 1; ITU-R BT.709-6 items 1.3, 1.4), CIE xy. */
const PRIMARIES_XY = { r: [0.64, 0.33], g: [0.3, 0.6], b: [0.15, 0.06], white: [0.3127, 0.329] } as const;

/** D65 reference white, relative XYZ with Yn = 1, from the xy above. */
const WHITE_XYZ: Readonly<Vec3> = xyToXyz(PRIMARIES_XY.white[0], PRIMARIES_XY.white[1]);

function xyToXyz(x: number, y: number): Vec3 {
  return [x / y, 1, (1 - x - y) / y];
}

/**
 * Linear RGB → XYZ matrix derived from the chromaticities (the usual derivation: scale the
 * primaries' XYZ columns so that RGB = 1,1,1 gives the white). Rounded to four decimals it is
 * the matrix printed in IEC 61966-2-1 (checked in the tests).
 */
const RGB_TO_XYZ: readonly number[] = (() => {
  const cols = [PRIMARIES_XY.r, PRIMARIES_XY.g, PRIMARIES_XY.b].map(([x, y]) => xyToXyz(x, y));
  // P = [cols] (3×3, column j = primary j); solve P · s = white for the scales s (Cramer's rule).
  const p = (row: number, col: number) => cols[col][row];
  const det3 = (m: (r: number, c: number) => number) =>
    m(0, 0) * (m(1, 1) * m(2, 2) - m(1, 2) * m(2, 1)) -
    m(0, 1) * (m(1, 0) * m(2, 2) - m(1, 2) * m(2, 0)) +
    m(0, 2) * (m(1, 0) * m(2, 1) - m(1, 1) * m(2, 0));
  const det = det3(p);
  const s = [0, 1, 2].map((j) => det3((r, c) => (c === j ? WHITE_XYZ[r] : p(r, c))) / det);
  const m: number[] = [];
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) m.push(p(r, c) * s[c]);
  return Object.freeze(m);
})();

const M00 = RGB_TO_XYZ[0], M01 = RGB_TO_XYZ[1], M02 = RGB_TO_XYZ[2];
const M10 = RGB_TO_XYZ[3], M11 = RGB_TO_XYZ[4], M12 = RGB_TO_XYZ[5];
const M20 = RGB_TO_XYZ[6], M21 = RGB_TO_XYZ[7], M22 = RGB_TO_XYZ[8];

/** Linear RGB (sRGB / BT.709 primaries, D65) → CIE XYZ, relative, Y of white = 1. */
export function rgbToXyz(rgb: Vec3Like, out: Vec3Out = [0, 0, 0]): Vec3 {
  const r = rgb[0], g = rgb[1], b = rgb[2];
  out[0] = M00 * r + M01 * g + M02 * b;
  out[1] = M10 * r + M11 * g + M12 * b;
  out[2] = M20 * r + M21 * g + M22 * b;
  return out as Vec3;
}

// ---------------------------------------------------------------------------------------------
// XYZ → CIELAB (CIE 15, D65 reference white)
// ---------------------------------------------------------------------------------------------

// CIE 15:2004 §8.2.1.1, with the junction written as the exact fractions the formula implies:
// t > (6/29)³ → t^(1/3); else t · (29/6)² / 3 + 4/29 (= 7.787… t + 16/116).
const LAB_EPSILON = 216 / 24389;
const LAB_SLOPE = 841 / 108;
const LAB_OFFSET = 4 / 29;
const INV_XN = 1 / WHITE_XYZ[0];
const INV_ZN = 1 / WHITE_XYZ[2];

/** CIE 15 XYZ (Y of white = 1) → CIELAB [L* 0…100, a*, b*] against the D65 white above. */
export function xyzToLab(xyz: Vec3Like, out: Vec3Out = [0, 0, 0]): Vec3 {
  const tx = xyz[0] * INV_XN, ty = xyz[1], tz = xyz[2] * INV_ZN;
  const fx = tx > LAB_EPSILON ? Math.cbrt(tx) : LAB_SLOPE * tx + LAB_OFFSET;
  const fy = ty > LAB_EPSILON ? Math.cbrt(ty) : LAB_SLOPE * ty + LAB_OFFSET;
  const fz = tz > LAB_EPSILON ? Math.cbrt(tz) : LAB_SLOPE * tz + LAB_OFFSET;
  out[0] = 116 * fy - 16;
  out[1] = 500 * (fx - fy);
  out[2] = 200 * (fy - fz);
  return out as Vec3;
}

const SRGB8_LINEAR: Float64Array = (() => {
  const lut = new Float64Array(256);
  for (let i = 0; i < 256; i++) lut[i] = srgbToLinear(i / 255);
  return lut;
})();

/** 8-bit sRGB code values (0…255 each) → CIELAB [L*, a*, b*] (D65, CIE 15). */
export function srgb8ToLab(r8: number, g8: number, b8: number, out: Vec3Out = [0, 0, 0]): Vec3 {
  out[0] = SRGB8_LINEAR[r8 & 255];
  out[1] = SRGB8_LINEAR[g8 & 255];
  out[2] = SRGB8_LINEAR[b8 & 255];
  rgbToXyz(out, out);
  return xyzToLab(out, out);
}

// ---------------------------------------------------------------------------------------------
// CIEDE2000 (CIE 142-2001; equations as numbered in Sharma, Wu & Dalal 2005), kL = kC = kH = 1
// ---------------------------------------------------------------------------------------------

const POW25_7 = 6103515625; // 25^7
const DEG = Math.PI / 180;
const RAD = 180 / Math.PI;
// Constant angles of the T term, as cos/sin pairs so T needs one cos and one sin of h̄'.
const COS30 = Math.cos(30 * DEG), SIN30 = Math.sin(30 * DEG);
const COS6 = Math.cos(6 * DEG), SIN6 = Math.sin(6 * DEG);
const COS63 = Math.cos(63 * DEG), SIN63 = Math.sin(63 * DEG);

/** CIEDE2000 colour difference ΔE00 (unitless) between two CIELAB triples, kL = kC = kH = 1. */
export function deltaE2000(lab1: Vec3Like, lab2: Vec3Like): number {
  const L1 = lab1[0], a1 = lab1[1], b1 = lab1[2];
  const L2 = lab2[0], a2 = lab2[1], b2 = lab2[2];

  // (2)–(6): G-adjusted a' and C'.
  const cBar = 0.5 * (Math.sqrt(a1 * a1 + b1 * b1) + Math.sqrt(a2 * a2 + b2 * b2));
  const cBar2 = cBar * cBar;
  const cBar7 = cBar2 * cBar2 * cBar2 * cBar;
  const g = 0.5 * (1 - Math.sqrt(cBar7 / (cBar7 + POW25_7)));
  const a1p = (1 + g) * a1, a2p = (1 + g) * a2;
  const c1p = Math.sqrt(a1p * a1p + b1 * b1), c2p = Math.sqrt(a2p * a2p + b2 * b2);

  // (8)–(14): differences and means. Δh' and h̄' are angles, but ΔH' and cos/sin h̄' only need
  // the hue unit vectors u1, u2: |u2 − u1| = 2 sin(|Δh'|/2), sign(Δh') = sign(u1 × u2), and
  // h̄' (the rule of eq. 14 picks the bisector of the shorter arc) is the direction of u1 + u2.
  // This saves four of six trigonometric calls per pair; when a chroma is 0, or the hues are
  // nearly opposite (within 1e-3 rad, where the direction of u1 + u2 loses precision), the
  // equations are taken as written.
  const dLp = L2 - L1;
  const dCp = c2p - c1p;
  const c12 = c1p * c2p;
  const lBarP = 0.5 * (L1 + L2);
  const cBarP = 0.5 * (c1p + c2p);
  let dHp = 0;
  let hBarP = 0;
  let c1 = 1;
  let s1 = 0;
  let vectorPath = false;
  if (c12 !== 0) {
    const u1x = a1p / c1p, u1y = b1 / c1p;
    const u2x = a2p / c2p, u2y = b2 / c2p;
    const sx = u1x + u2x, sy = u1y + u2y;
    const sum2 = sx * sx + sy * sy;
    if (sum2 > 1e-6) {
      const ex = u2x - u1x, ey = u2y - u1y;
      const chord = Math.sqrt(ex * ex + ey * ey);
      dHp = (u1x * u2y - u1y * u2x < 0 ? -chord : chord) * Math.sqrt(c12);
      const inv = 1 / Math.sqrt(sum2);
      c1 = sx * inv;
      s1 = sy * inv;
      hBarP = Math.atan2(sy, sx) * RAD;
      if (hBarP < 0) hBarP += 360;
      vectorPath = true;
    }
  }
  if (!vectorPath) {
    let h1p = a1p === 0 && b1 === 0 ? 0 : Math.atan2(b1, a1p) * RAD;
    if (h1p < 0) h1p += 360;
    let h2p = a2p === 0 && b2 === 0 ? 0 : Math.atan2(b2, a2p) * RAD;
    if (h2p < 0) h2p += 360;
    let dhp = 0;
    hBarP = h1p + h2p;
    if (c12 !== 0) {
      dhp = h2p - h1p;
      if (dhp > 180) dhp -= 360;
      else if (dhp < -180) dhp += 360;
      if (Math.abs(h1p - h2p) <= 180) hBarP *= 0.5;
      else if (hBarP < 360) hBarP = 0.5 * (hBarP + 360);
      else hBarP = 0.5 * (hBarP - 360);
    }
    dHp = 2 * Math.sqrt(c12) * Math.sin(dhp * 0.5 * DEG);
    c1 = Math.cos(hBarP * DEG);
    s1 = Math.sin(hBarP * DEG);
  }

  // (15): T = 1 − 0.17 cos(h̄'−30°) + 0.24 cos(2h̄') + 0.32 cos(3h̄'+6°) − 0.20 cos(4h̄'−63°),
  // with the multiple angles from the one cos/sin pair.
  const c2 = 2 * c1 * c1 - 1, s2 = 2 * s1 * c1;
  const c3 = c1 * (4 * c1 * c1 - 3), s3 = s1 * (3 - 4 * s1 * s1);
  const c4 = 2 * c2 * c2 - 1, s4 = 2 * s2 * c2;
  const t =
    1 -
    0.17 * (c1 * COS30 + s1 * SIN30) +
    0.24 * c2 +
    0.32 * (c3 * COS6 - s3 * SIN6) -
    0.2 * (c4 * COS63 + s4 * SIN63);

  // (16)–(22): weights and rotation.
  const hd = (hBarP - 275) / 25;
  const dTheta = 30 * Math.exp(-hd * hd);
  const cBarP2 = cBarP * cBarP;
  const cBarP7 = cBarP2 * cBarP2 * cBarP2 * cBarP;
  const rc = 2 * Math.sqrt(cBarP7 / (cBarP7 + POW25_7));
  const l50 = (lBarP - 50) * (lBarP - 50);
  const sl = 1 + (0.015 * l50) / Math.sqrt(20 + l50);
  const sc = 1 + 0.045 * cBarP;
  const sh = 1 + 0.015 * cBarP * t;
  const rt = -Math.sin(2 * dTheta * DEG) * rc;

  const tl = dLp / sl, tc = dCp / sc, th = dHp / sh;
  return Math.sqrt(tl * tl + tc * tc + th * th + rt * tc * th);
}
