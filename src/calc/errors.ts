/**
 * Input errors raised by the calculation engine. Every calculation validates
 * its inputs and names the offending field, so the caller (screen, CLI,
 * importer) can point the user at it instead of showing NaN.
 */
export class CalcInputError extends Error {
  override readonly name = 'CalcInputError';
  constructor(
    /** Dotted path of the offending input, e.g. `existing.ratedWattsPerLamp`. */
    readonly field: string,
    /** What is wrong, in plain words. */
    readonly problem: string,
  ) {
    super(`${field}: ${problem}`);
  }
}

function describe(value: unknown): string {
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (typeof value === 'string') return JSON.stringify(value);
  return typeof value;
}

/**
 * Returns `value` when it is a finite number within [min, max]; throws a
 * {@link CalcInputError} naming `field` otherwise.
 *
 * @example
 * checkRange('hoursPerYear', 3000, 0, 8760) //=> 3000
 */
export function checkRange(field: string, value: number, min: number, max: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new CalcInputError(field, `must be a finite number (got ${describe(value)})`);
  }
  if (value < min || value > max) {
    throw new CalcInputError(field, `must be between ${min} and ${max} (got ${value})`);
  }
  return value;
}

/** Like {@link checkRange} but also requires a whole number. */
export function checkInteger(field: string, value: number, min: number, max: number): number {
  checkRange(field, value, min, max);
  if (!Number.isInteger(value)) throw new CalcInputError(field, `must be a whole number (got ${value})`);
  return value;
}
