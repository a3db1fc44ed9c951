import { MetrologyError } from './metrology-error.js';

// Internal input guards shared by the public functions. Messages follow the
// "<fn> requires ..." pattern and carry no final period.

/** Throws unless every element is a finite number. */
export function assertFiniteArray(fn: string, name: string, values: ArrayLike<number>): void {
  for (let i = 0; i < values.length; i++) {
    const value = values[i];
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      throw new MetrologyError('not_finite', `${fn} requires finite numbers in ${name} (index ${i} is ${String(value)})`);
    }
  }
}

/** Throws unless the value is a finite number. */
export function assertFinite(fn: string, name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new MetrologyError('not_finite', `${fn} requires ${name} to be a finite number (got ${String(value)})`);
  }
}

/** Throws unless the value is a finite number greater than zero. */
export function assertPositive(fn: string, name: string, value: number, code: 'bad_argument' | 'bad_frequency' = 'bad_argument'): void {
  assertFinite(fn, name, value);
  if (value <= 0) {
    throw new MetrologyError(code, `${fn} requires ${name} greater than zero (got ${value})`);
  }
}

/** Throws unless the value is a finite number not below zero. */
export function assertNonNegative(fn: string, name: string, value: number): void {
  assertFinite(fn, name, value);
  if (value < 0) {
    throw new MetrologyError('bad_argument', `${fn} requires ${name} of zero or more (got ${value})`);
  }
}

/** Throws unless both arrays have the same length. */
export function assertSameLength(fn: string, a: ArrayLike<number>, b: ArrayLike<number>): void {
  if (a.length !== b.length) {
    throw new MetrologyError('length_mismatch', `${fn} requires arrays of equal length (got ${a.length} and ${b.length})`);
  }
}

/** Throws unless there are at least `min` points. */
export function assertMinLength(fn: string, values: ArrayLike<number>, min: number): void {
  if (values.length < min) {
    throw new MetrologyError('too_few_points', `${fn} requires at least ${min} data points`);
  }
}
