import 'reflect-metadata';
import { loadConfig } from './config/app-config.js';
import { BENCH_USAGE, benchTokenName, issueBenchTokenByName } from './benches/bench-token-cli.js';
import { createDataSource } from './database/create-data-source.js';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, ensureAdmin, seedDemo } from './seed/demo-seed.js';

const USAGE = `Usage: node backend/dist/cli.js <command>

Commands:
  migrate   run pending migrations
  revert    revert the newest migration
  seed      load the demo data once (demo mode) or make sure an admin exists (production mode)
  accounts  print the demo accounts
  remind    send the recall reminders that are due now (instruments due within 30 days, once per due date)
  bench     bench token "<bench name>": issue a fresh bridge token for a bench and print only the token`;

/** `bench token "<name>"` prints nothing but the token (scripts read it), so it runs apart from the other commands. */
async function bench(args: string[]): Promise<void> {
  const name = benchTokenName(args);
  if (name === null) {
    console.log(BENCH_USAGE);
    return;
  }
  const dataSource = createDataSource();
  await dataSource.initialize();
  try {
    process.stdout.write((await issueBenchTokenByName(dataSource, name)) + '\n');
  } finally {
    await dataSource.destroy();
  }
}

async function main([command, ...rest]: string[]): Promise<void> {
  if (!command || command === '--help' || command === '-h') {
    console.log(USAGE);
    return;
  }
  if (command === 'bench') return bench(rest);
  if (command === 'accounts') {
    for (const a of DEMO_ACCOUNTS) console.log(`  ${a.role.padEnd(11)} ${a.email.padEnd(26)} ${DEMO_PASSWORD}`);
    return;
  }
  const config = loadConfig();
  const dataSource = createDataSource();
  await dataSource.initialize();
  try {
    if (command === 'migrate') {
      const ran = await dataSource.runMigrations({ transaction: 'each' });
      console.log(ran.length ? `Migrations applied: ${ran.map((m) => m.name).join(', ')}` : 'Database schema is up to date');
    } else if (command === 'remind') {
      const { runRemindCommand } = await import('./recall/remind-command.js');
      console.log(await runRemindCommand(dataSource, config));
    } else if (command === 'revert') {
      await dataSource.undoLastMigration({ transaction: 'each' });
      console.log('Reverted the newest migration');
    } else if (command === 'seed') {
      if (config.mode === 'demo') {
        console.log((await seedDemo(dataSource, config)) ? 'Demo data loaded' : 'Demo data already present');
      } else {
        const email = config.adminEmail;
        console.log((await ensureAdmin(dataSource, config, email)) ? `Admin ${email} created` : 'An admin exists');
      }
    } else {
      throw new Error(`unknown command "${command}"\n${USAGE}`);
    }
  } finally {
    await dataSource.destroy();
  }
}

main(process.argv.slice(2)).catch((error: unknown) => {
  console.error(`kilocycle: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
