/**
 * Input guards for the computations (internal; not exported from shared/calc/index.ts).
 *
 * The convention (DEVELOPERS.md "Bad input"): a number that is not a number (NaN, ±Infinity) or
 * lies outside what the quantity can be (a negative current, load, rating, torque …) is refused with
 * a RangeError naming the input; it never becomes an answer. Missing optional data (a rating not
 * recorded, a size the table has no row for) is not an error: that answer is null with a reason.
 */

/** A finite number, else a RangeError naming it. */
export function finite(name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number, got ${String(value)}`);
  }
  return value;
}

/** A finite number ≥ 0. */
export function nonNegative(name: string, value: number): number {
  finite(name, value);
  if (value < 0) throw new RangeError(`${name} cannot be negative, got ${value}`);
  return value;
}

/** A finite number > 0. */
export function positive(name: string, value: number): number {
  finite(name, value);
  if (!(value > 0)) throw new RangeError(`${name} must be more than 0, got ${value}`);
  return value;
}

/** A whole number ≥ min. */
export function wholeFrom(name: string, value: number, min: number): number {
  if (!Number.isInteger(value) || value < min) {
    throw new RangeError(`${name} must be a whole number from ${min} up, got ${String(value)}`);
  }
  return value;
}

/** One of the allowed values, else a RangeError listing them. */
export function oneOf<T>(name: string, value: T, allowed: readonly T[]): T {
  if (!allowed.includes(value)) {
    throw new RangeError(`${name} must be one of ${allowed.join(', ')}, got ${String(value)}`);
  }
  return value;
}
