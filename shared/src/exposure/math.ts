// Exposure arithmetic in stops (base-2 logarithms), after the APEX system: Ev = Av + Tv,
// Av = log2(N²), Tv = log2(1/t). Every function refuses input that has no physical meaning
// (zero, negative, NaN, Infinity) with an InvalidInputError a person can act on.
import { InvalidInputError } from '../errors.ts';
import { requireFinite, requireNonNegative, requirePositive } from './guards.ts';

const FPS_MUST_BE = 'Frame rate must be a positive number of frames per second';

/** Returns the stops from `a` to `b` (log2(b / a)); positive when b is larger. For ISO values or exposure times. */
export function stopsBetween(a: number, b: number): number {
  requirePositive(a, 'a', 'The first value must be a positive number (an ISO value or a time in seconds)');
  requirePositive(b, 'b', 'The second value must be a positive number (an ISO value or a time in seconds)');
  return Math.log2(b / a);
}

/** Returns the stops of light lost going from f-number n1 to n2 (2·log2(n2 / n1)); positive when n2 is narrower. */
export function apertureStops(n1: number, n2: number): number {
  requirePositive(n1, 'n1', 'The first f-number must be a positive number such as 2.8');
  requirePositive(n2, 'n2', 'The second f-number must be a positive number such as 5.6');
  return 2 * Math.log2(n2 / n1);
}

/** Returns the exposure value referred to ISO 100, in EV (APEX: log2(N²/t) − log2(iso/100)). */
export function ev100(fNumber: number, seconds: number, iso = 100): number {
  requirePositive(fNumber, 'fNumber', 'Aperture must be a positive f-number such as 5.6');
  requirePositive(seconds, 'seconds', 'Exposure time must be a positive number of seconds');
  requirePositive(iso, 'iso', 'ISO must be a positive number such as 100');
  return Math.log2((fNumber * fNumber) / seconds) - Math.log2(iso / 100);
}

function requireAngle(angleDeg: unknown, field: string): number {
  const angle = requireFinite(angleDeg, field, 'Shutter angle must be a number of degrees above 0 and at most 360');
  if (angle <= 0 || angle > 360) {
    throw new InvalidInputError(
      `Shutter angle must be above 0° and at most 360° (got ${angle}°); a rotary shutter cannot stay open longer than one frame.`,
      field,
    );
  }
  return angle;
}

/** Returns the exposure time in seconds for a shutter angle in degrees at a frame rate in fps: angle / (360 · fps). */
export function shutterAngleToSeconds(angleDeg: number, fps: number): number {
  const angle = requireAngle(angleDeg, 'angleDeg');
  requirePositive(fps, 'fps', FPS_MUST_BE);
  return angle / (360 * fps);
}

/** Returns the shutter angle in degrees for an exposure time in seconds at a frame rate in fps: 360 · fps · t. */
export function secondsToShutterAngle(seconds: number, fps: number): number {
  requirePositive(seconds, 'seconds', 'Exposure time must be a positive number of seconds');
  requirePositive(fps, 'fps', FPS_MUST_BE);
  const angle = 360 * fps * seconds;
  // Allow float noise at exactly one frame (e.g. 1/24 s at 24 fps).
  if (angle > 360 * (1 + 1e-9)) {
    throw new InvalidInputError(
      `An exposure of ${seconds} s is longer than one frame at ${fps} fps (it would need ${angle.toFixed(1)}°); use at most ${(1 / fps).toPrecision(4)} s.`,
      'seconds',
    );
  }
  return Math.min(angle, 360);
}

const ND_MUST_BE = 'ND optical density must be a number at or above 0, such as 0.3, 0.6 or 0.9';

/** Returns the stops of light an ND filter removes, from its optical density: OD / log10(2). */
export function ndStops(opticalDensity: number): number {
  requireNonNegative(opticalDensity, 'opticalDensity', ND_MUST_BE);
  return opticalDensity / Math.log10(2);
}

/** Returns the optical density (unitless, base-10) that removes the given number of stops: stops · log10(2). */
export function ndDensityForStops(stops: number): number {
  requireNonNegative(stops, 'stops', 'Stops of ND must be a number at or above 0');
  return stops * Math.log10(2);
}

/** Returns the fraction of light (0…1) an ND filter passes, from its optical density: 10^−OD. */
export function ndTransmission(opticalDensity: number): number {
  requireNonNegative(opticalDensity, 'opticalDensity', ND_MUST_BE);
  return 10 ** -opticalDensity;
}
