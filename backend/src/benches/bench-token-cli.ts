import type { DataSource } from 'typeorm';
import { Bench } from './bench.entity.js';
import { issueBenchToken } from './bench-token.js';

export const BENCH_USAGE = `Usage: bin/kilocycle bench token "<bench name>"

Issues a fresh bridge token for the named bench and prints only the token. The bench's previous
token stops working at once; the token itself is not stored (only its SHA-256), so keep it now.
The action is recorded in the audit log (actor: the command line). Bench names are matched exactly,
ignoring case.`;

/** The bench name a `bench token "<name>"` command line names, or null when it asks for help; throws on misuse. */
export function benchTokenName(args: string[]): string | null {
  const [command, ...rest] = args;
  if (!command || command === '--help' || command === '-h' || rest.includes('--help') || rest.includes('-h')) return null;
  if (command !== 'token') throw new Error(`unknown bench command "${command}" (see bin/kilocycle bench --help)`);
  if (rest.length !== 1 || rest[0].trim() === '') throw new Error('give exactly one bench name, quoted if it has spaces: bin/kilocycle bench token "Bench 1"');
  return rest[0].trim();
}

/**
 * `bin/kilocycle bench token "<name>"`: issues a fresh token for the named bench in one transaction and
 * returns it. The data source comes from the command line's composition root (cli.ts).
 */
export async function issueBenchTokenByName(dataSource: DataSource, name: string): Promise<string> {
  return dataSource.transaction(async (manager) => {
    const bench = await manager.getRepository(Bench).createQueryBuilder('b').where('LOWER(b.name) = LOWER(:name)', { name }).getOne();
    if (!bench) {
      const names = (await manager.find(Bench, { order: { name: 'ASC' } })).map((b) => `"${b.name}"`);
      throw new Error(`there is no bench named "${name}"${names.length ? `; benches: ${names.join(', ')}` : '; an admin creates benches on the Benches page'}`);
    }
    if (!bench.active) throw new Error(`bench "${bench.name}" is deactivated; an admin reactivates it on the Benches page first`);
    return issueBenchToken(manager, bench.id, null, 'cli');
  });
}
