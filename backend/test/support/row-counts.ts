import type { DataSource } from 'typeorm';

/**
 * Exact row counts of every table of the test database, in one statement (COUNT(*), not the
 * estimate information_schema.TABLE_ROWS gives). The list of tables is read once per data source.
 */
export async function rowCounter(ds: DataSource, skip: string[] = ['migrations']): Promise<() => Promise<Record<string, number>>> {
  const tables = (
    (await ds.query(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' ORDER BY table_name",
    )) as Array<{ name: string }>
  )
    .map((row) => row.name)
    .filter((name) => !skip.includes(name));
  const sql = `SELECT ${tables.map((name) => `(SELECT COUNT(*) FROM \`${name}\`) AS \`${name}\``).join(', ')}`;
  return async () => {
    const [row] = (await ds.query(sql)) as Array<Record<string, string | number>>;
    return Object.fromEntries(Object.entries(row).map(([name, count]) => [name, Number(count)]));
  };
}

/** The tables whose count differs between two snapshots, as "table before→after". */
export function countChanges(before: Record<string, number>, after: Record<string, number>): string[] {
  return Object.keys(before)
    .filter((name) => before[name] !== after[name])
    .map((name) => `${name} ${before[name]}→${after[name]}`);
}
