import { InvalidInputError } from '../errors.ts';

/** Returns how a refused input reads inside a message, e.g. "(got 0)" or "(got nothing)". */
export function gotText(input: unknown): string {
  if (input === undefined || input === null || input === '') return '(got nothing)';
  if (typeof input === 'string') return `(got "${input}")`;
  if (typeof input === 'number' || typeof input === 'boolean') return `(got ${String(input)})`;
  return `(got ${Array.isArray(input) ? 'a list' : typeof input})`;
}

/** Returns `value` when it is a finite number above zero; otherwise throws InvalidInputError. */
export function requirePositive(value: unknown, field: string, mustBe: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new InvalidInputError(`${mustBe} ${gotText(value)}.`, field);
  }
  return value;
}

/** Returns `value` when it is a finite number at or above zero; otherwise throws InvalidInputError. */
export function requireNonNegative(value: unknown, field: string, mustBe: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    throw new InvalidInputError(`${mustBe} ${gotText(value)}.`, field);
  }
  return value;
}

/** Returns `value` when it is a finite number (any sign); otherwise throws InvalidInputError. */
export function requireFinite(value: unknown, field: string, mustBe: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new InvalidInputError(`${mustBe} ${gotText(value)}.`, field);
  }
  return value;
}

/** Throws InvalidInputError unless min ≤ max (both already checked as numbers). */
export function requireOrdered(min: number, max: number, field: string, what: string): void {
  if (min > max) {
    throw new InvalidInputError(
      `${what}: the lower end (${min}) must not be above the upper end (${max}); swap them.`,
      field,
    );
  }
}

/** The two ladder spacings the product offers. */
export type StopStep = 'full' | 'third';

/** Returns the step unchanged when it is 'full' or 'third'; otherwise throws InvalidInputError. */
export function requireStep(step: unknown, field = 'step'): StopStep {
  if (step !== 'full' && step !== 'third') {
    throw new InvalidInputError(`Step must be "full" or "third" ${gotText(step)}.`, field);
  }
  return step;
}
