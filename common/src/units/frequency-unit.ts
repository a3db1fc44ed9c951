import { UnitParseError } from './unit-parse-error.js';

/** The frequency units a dial or a typed value may be in. */
export type FrequencyUnit = 'Hz' | 'kHz' | 'MHz';

/** Hertz in one of each unit. */
export const FREQUENCY_UNIT_HZ: Readonly<Record<FrequencyUnit, number>> = Object.freeze({
  Hz: 1,
  kHz: 1e3,
  MHz: 1e6,
});

/**
 * Hertz per unit, checking that the unit is one of the supported ones
 * (useful when the unit comes from stored data rather than from the type system).
 *
 * @param unit 'Hz', 'kHz' or 'MHz'
 * @returns 1, 1 000 or 1 000 000
 * @throws {UnitParseError} code 'unknown_unit' for anything else
 * @example unitMultiplier('kHz'); // => 1000
 */
export function unitMultiplier(unit: FrequencyUnit): number {
  const multiplier = (FREQUENCY_UNIT_HZ as Record<string, number | undefined>)[unit];
  if (multiplier === undefined) {
    throw new UnitParseError('unknown_unit', `unknown frequency unit '${String(unit)}' (use Hz, kHz or MHz)`, String(unit));
  }
  return multiplier;
}
