import { Column, type ColumnOptions, type ValueTransformer } from 'typeorm';

/**
 * A BIGINT column of integer minor units read back as a number. mysql2 hands BIGINT back as text; every amount
 * the app stores stays far inside Number's safe range (common/src/money/money-limits.ts), which this checks on
 * the way out of the database so a corrupt row fails loudly instead of rounding.
 */
export const MINOR_UNITS: ValueTransformer = {
  to: (value: number | null | undefined) => value,
  from: (value: string | number | null) => {
    if (value === null || value === undefined) return value;
    const n = Number(value);
    if (!Number.isSafeInteger(n)) throw new Error(`a stored amount of minor units is not a safe whole number: ${String(value)}`);
    return n;
  },
};

/** A money column: integer minor units as BIGINT (a 32-bit INT stops at 21 million in major units), through MINOR_UNITS. */
export function MoneyColumn(name: string, options: Pick<ColumnOptions, 'default' | 'nullable'> = {}): PropertyDecorator {
  return Column({ name, type: 'bigint', ...options, transformer: MINOR_UNITS });
}
