import { Column, type ColumnOptions } from 'typeorm';

/**
 * A money column: integer minor units as BIGINT (a 32-bit INT stops at 21 million in major units), read back as a
 * JS number (mysql2 hands BIGINT over as text). Amounts stay far inside Number's safe range (common MONEY_LIMITS).
 */
export function MoneyColumn(name: string, options: Pick<ColumnOptions, 'default' | 'nullable'> = {}): PropertyDecorator {
  return Column({
    name,
    type: 'bigint',
    ...options,
    transformer: {
      to: (value: number | null | undefined) => value,
      from: (value: string | number | null) => (value === null ? null : Number(value)),
    },
  });
}
