/** A JSON column's value: mysql2 hands MariaDB's JSON (a LONGTEXT alias) back as text on raw queries. */
export function jsonColumn<T>(value: unknown): T {
  return (typeof value === 'string' ? JSON.parse(value) : value) as T;
}
