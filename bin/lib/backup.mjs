// Backup and restore of a Kilocycle installation: `bin/kilocycle backup` and `bin/kilocycle restore` call
// this with KC_VAR_DIR and KC_DB_PORT set. Node built-ins only, so it runs before (or without) a build.
//
// One archive, kilocycle-YYYYMMDD-HHMMSS.tar.gz (UTC), holding one top folder `kilocycle-backup/`:
//   manifest.json   format, versions, time, database name, migrations, row counts, every file with size and SHA-256
//   SHA256SUMS      the SHA-256 of manifest.json and of every other member (`sha256sum -c` reads it)
//   database.sql    mariadb-dump --single-transaction of the Kilocycle database (one consistent snapshot),
//                   certificate PDFs and attachments included (stored_files)
//   files/keys/ files/jwt-secret files/db-password   copies from var/ (and files/certificates/,
//                   files/uploads/ where a Kilocycle from before the file store left those folders)
//
// The archive is written and read with Debian's GNU tar and gzip rather than an npm tar package: both are
// part of every Debian system (no new dependency in the lockfile), they stream a large dump without
// holding it in memory, gzip's CRC refuses a damaged stream, and an operator can open the archive with
// the same standard tools on any machine.
import { spawnSync } from 'node:child_process';
import { createHash, createPublicKey } from 'node:crypto';
import {
  chmodSync,
  closeSync,
  copyFileSync,
  cpSync,
  existsSync,
  lstatSync,
  mkdirSync,
  mkdtempSync,
  openSync,
  readdirSync,
  readFileSync,
  renameSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
const VAR = resolve(process.env.KC_VAR_DIR ?? join(ROOT, 'var'));
const DB_SOCK = join(VAR, 'mariadb', 'mysqld.sock');
const DB_NAME = process.env.KC_DB_NAME ?? 'kilocycle';
const FORMAT = 'kilocycle-backup';
const FORMAT_VERSION = 1;
const TOP = 'kilocycle-backup';
/** Folders of var/ that hold records (copied whole) and the secrets (single files). */
const RECORD_DIRS = ['keys', 'certificates', 'uploads'];
const SECRETS = ['jwt-secret', 'db-password'];
const MEMBER = /^(manifest\.json|database\.sql|files\/(jwt-secret|db-password)|files\/(keys|certificates|uploads)\/[A-Za-z0-9._\-/]+)$/;

/** A refusal or a failure the operator can act on: printed as one line, no stack. */
class Stop extends Error {}

// ---- small tools ---------------------------------------------------------------------------------

function sql(statements, database = null) {
  const args = ['--no-defaults', `--socket=${DB_SOCK}`, '-uroot', '-N', '-B', '--default-character-set=utf8mb4', '-e', statements];
  if (database) args.push(database);
  const r = spawnSync('mariadb', args, { encoding: 'utf8' });
  if (r.status !== 0) throw new Stop(`the database answered: ${(r.stderr || r.error?.message || '').trim()}`);
  return r.stdout
    .split('\n')
    .filter((l) => l !== '')
    .map((l) => l.split('\t'));
}

function dbRunning() {
  return existsSync(DB_SOCK) && spawnSync('mariadb-admin', ['--no-defaults', `--socket=${DB_SOCK}`, '-uroot', 'ping'], { stdio: 'ignore' }).status === 0;
}

/** Starts the private server through bin/kilocycle (one implementation of set-up); its words go to stderr. */
function kilocycleDb(command) {
  const r = spawnSync(join(ROOT, 'bin', 'kilocycle'), ['db', command], { stdio: ['ignore', 2, 2], env: process.env });
  if (r.status !== 0) throw new Stop(`bin/kilocycle db ${command} failed (see the messages above)`);
}

function checkDbName() {
  // The app user may use kilocycle and kilocycle_… only; the name also goes into SQL unquoted-safe.
  if (!/^kilocycle(_[A-Za-z0-9_]{1,40})?$/.test(DB_NAME)) throw new Stop(`KC_DB_NAME must be kilocycle or kilocycle_<letters, digits, _> (got "${DB_NAME}")`);
}

function sha256File(path) {
  return createHash('sha256').update(readFileSync(path)).digest('hex');
}

/** Every regular file under dir, as paths relative to dir, sorted; refuses links and devices. */
function walk(dir, base = dir) {
  if (!existsSync(dir)) return [];
  const out = [];
  for (const name of readdirSync(dir).sort()) {
    const full = join(dir, name);
    const st = lstatSync(full);
    if (st.isDirectory()) out.push(...walk(full, base));
    else if (st.isFile()) out.push(relative(base, full));
    else throw new Stop(`${full} is neither a file nor a folder (a link or a device); Kilocycle does not put those in var/`);
  }
  return out;
}

function utcStamp(date) {
  const p = (n) => String(n).padStart(2, '0');
  return `${date.getUTCFullYear()}${p(date.getUTCMonth() + 1)}${p(date.getUTCDate())}-${p(date.getUTCHours())}${p(date.getUTCMinutes())}${p(date.getUTCSeconds())}`;
}

function kilocycleVersion() {
  try {
    return JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')).version ?? 'unknown';
  } catch {
    return 'unknown';
  }
}

/** The key id the server stores with each signature: first 16 hex digits of SHA-256 of the public key (DER). */
function keyIdOf(publicPemPath) {
  if (!existsSync(publicPemPath)) return null;
  const der = createPublicKey(readFileSync(publicPemPath)).export({ type: 'spki', format: 'der' });
  return createHash('sha256').update(der).digest('hex').slice(0, 16);
}

function hasSchema() {
  const [[n]] = sql(`SELECT COUNT(*) FROM information_schema.tables WHERE table_schema = '${DB_NAME}' AND table_name = 'kc_migrations'`);
  return Number(n) > 0;
}

function tableCount() {
  const [[n]] = sql(`SELECT COUNT(*) FROM information_schema.tables WHERE table_schema = '${DB_NAME}'`);
  return Number(n);
}

/** Counts the manifest carries, read in one consistent snapshot taken just before the dump's own. */
function snapshotCounts() {
  const rows = sql(
    'SET SESSION TRANSACTION ISOLATION LEVEL REPEATABLE READ; START TRANSACTION WITH CONSISTENT SNAPSHOT; ' +
      'SELECT (SELECT COUNT(*) FROM kc_migrations), (SELECT name FROM kc_migrations ORDER BY timestamp DESC, id DESC LIMIT 1), ' +
      '(SELECT COUNT(*) FROM certificates), (SELECT COUNT(*) FROM certificates WHERE signature IS NOT NULL), (SELECT COUNT(*) FROM readings); COMMIT;',
    DB_NAME,
  );
  const [migrations, last, certificates, signed, readings] = rows[0];
  return {
    migrations: { count: Number(migrations), last: last === 'NULL' ? null : last },
    counts: { certificates: Number(certificates), signedCertificates: Number(signed), readings: Number(readings) },
  };
}

function restoredCounts() {
  const [[certificates, signed, readings]] = sql(
    'SELECT (SELECT COUNT(*) FROM certificates), (SELECT COUNT(*) FROM certificates WHERE signature IS NOT NULL), (SELECT COUNT(*) FROM readings)',
    DB_NAME,
  );
  return { certificates: Number(certificates), signedCertificates: Number(signed), readings: Number(readings) };
}

// ---- backup --------------------------------------------------------------------------------------

/**
 * Dumps the database first, then copies the files: PDFs, keys and uploads are only ever added, so the
 * files copied afterwards hold everything the dumped rows refer to.
 */
function makeBackup(toDir, prefix = 'kilocycle') {
  checkDbName();
  if (!dbRunning()) throw new Stop(`the private database is not running (socket ${DB_SOCK})`);
  if (!hasSchema()) throw new Stop(`database ${DB_NAME} holds no Kilocycle schema: nothing to back up (run bin/kilocycle start or migrate first)`);
  mkdirSync(toDir, { recursive: true, mode: 0o700 });
  const created = new Date();
  let name = `${prefix}-${utcStamp(created)}.tar.gz`;
  for (let n = 2; existsSync(join(toDir, name)); n += 1) name = `${prefix}-${utcStamp(created)}-${n}.tar.gz`;
  const target = join(toDir, name);
  const partial = `${target}.partial`;
  const staging = mkdtempSync(join(toDir, '.staging-'));
  try {
    const top = join(staging, TOP);
    mkdirSync(join(top, 'files'), { recursive: true });
    const snapshot = snapshotCounts();
    const [[serverVersion]] = sql('SELECT VERSION()');
    const dump = spawnSync(
      'mariadb-dump',
      [
        '--no-defaults',
        `--socket=${DB_SOCK}`,
        '-uroot',
        '--single-transaction',
        '--quick',
        '--routines',
        '--triggers',
        '--hex-blob',
        '--default-character-set=utf8mb4',
        '--skip-dump-date',
        `--result-file=${join(top, 'database.sql')}`,
        DB_NAME,
      ],
      { encoding: 'utf8' },
    );
    if (dump.status !== 0) throw new Stop(`mariadb-dump failed: ${(dump.stderr || dump.error?.message || '').trim()}`);
    for (const dir of RECORD_DIRS) {
      for (const rel of walk(join(VAR, dir))) {
        const dest = join(top, 'files', dir, rel);
        mkdirSync(dirname(dest), { recursive: true });
        copyFileSync(join(VAR, dir, rel), dest);
      }
    }
    for (const secret of SECRETS) {
      if (existsSync(join(VAR, secret))) copyFileSync(join(VAR, secret), join(top, 'files', secret));
    }
    const files = walk(top).map((rel) => ({ path: rel, size: statSync(join(top, rel)).size, sha256: sha256File(join(top, rel)) }));
    for (const f of files)
      if (!MEMBER.test(f.path)) throw new Stop(`cannot back up ${f.path}: names under var/ may hold letters, digits, '.', '_' and '-' only`);
    const manifest = {
      format: FORMAT,
      formatVersion: FORMAT_VERSION,
      kilocycleVersion: kilocycleVersion(),
      createdAt: created.toISOString(),
      database: { name: DB_NAME, server: serverVersion, migrations: snapshot.migrations, counts: snapshot.counts },
      files,
    };
    writeFileSync(join(top, 'manifest.json'), JSON.stringify(manifest, null, 2) + '\n');
    const sums = [{ path: 'manifest.json', sha256: sha256File(join(top, 'manifest.json')) }, ...files];
    writeFileSync(join(top, 'SHA256SUMS'), sums.map((f) => `${f.sha256}  ${f.path}\n`).join(''));
    const tar = spawnSync('tar', ['-czf', partial, '-C', staging, TOP], { encoding: 'utf8' });
    if (tar.status !== 0) throw new Stop(`tar could not write ${partial}: ${(tar.stderr || tar.error?.message || '').trim()}`);
    chmodSync(partial, 0o600); // it holds the signing key and the secrets
    renameSync(partial, target);
    return { path: target, manifest };
  } finally {
    rmSync(staging, { recursive: true, force: true });
    rmSync(partial, { force: true });
  }
}

// ---- verification --------------------------------------------------------------------------------

/** Extracts into `work` and checks every member against SHA256SUMS and the manifest; returns the manifest. */
function verifyArchive(archive, work) {
  const damaged = (why) => new Stop(`${archive} is damaged or is not a Kilocycle backup: ${why}. Nothing was changed.`);
  const tar = spawnSync('tar', ['-xzf', archive, '-C', work, '--no-same-owner'], { encoding: 'utf8' });
  if (tar.status !== 0) throw damaged(`it cannot be unpacked (${(tar.stderr || tar.error?.message || '').trim().split('\n')[0]})`);
  let found;
  try {
    found = walk(work);
  } catch (error) {
    throw damaged(error.message);
  }
  const outside = found.find((p) => !p.startsWith(`${TOP}/`));
  if (outside) throw damaged(`it holds ${outside}, outside ${TOP}/`);
  const top = join(work, TOP);
  for (const needed of ['manifest.json', 'SHA256SUMS', 'database.sql']) {
    if (!existsSync(join(top, needed))) throw damaged(`${needed} is missing`);
  }
  const sums = new Map();
  for (const line of readFileSync(join(top, 'SHA256SUMS'), 'utf8').split('\n').filter(Boolean)) {
    const m = /^([0-9a-f]{64}) {2}(.+)$/.exec(line);
    if (!m) throw damaged(`SHA256SUMS has a malformed line "${line.slice(0, 80)}"`);
    sums.set(m[2], m[1]);
  }
  const manifestSum = sha256File(join(top, 'manifest.json'));
  if (sums.get('manifest.json') !== manifestSum) throw damaged('manifest.json does not match its SHA-256 in SHA256SUMS');
  let manifest;
  try {
    manifest = JSON.parse(readFileSync(join(top, 'manifest.json'), 'utf8'));
  } catch {
    throw damaged('manifest.json is not valid JSON');
  }
  if (manifest?.format !== FORMAT || !Array.isArray(manifest.files) || typeof manifest.database?.name !== 'string')
    throw damaged('manifest.json is not a Kilocycle backup manifest');
  if (manifest.formatVersion !== FORMAT_VERSION)
    throw new Stop(`${archive} has backup format ${manifest.formatVersion}; this Kilocycle reads format ${FORMAT_VERSION}. Nothing was changed.`);
  const listed = new Set(manifest.files.map((f) => f.path));
  const onDisk = found.map((p) => p.slice(TOP.length + 1)).filter((p) => p !== 'manifest.json' && p !== 'SHA256SUMS');
  for (const p of onDisk) if (!listed.has(p)) throw damaged(`${p} is in the archive but not in the manifest`);
  for (const f of manifest.files) {
    if (typeof f.path !== 'string' || !MEMBER.test(f.path) || f.path.split('/').includes('..'))
      throw damaged(`the manifest names an unexpected member "${String(f.path).slice(0, 80)}"`);
    const path = join(top, f.path);
    if (!existsSync(path)) throw damaged(`${f.path} is listed in the manifest but missing`);
    const actual = sha256File(path);
    if (actual !== f.sha256 || actual !== sums.get(f.path) || statSync(path).size !== f.size) throw damaged(`${f.path} does not match its SHA-256 checksum`);
  }
  if (sums.size !== manifest.files.length + 1) throw damaged('SHA256SUMS and the manifest list different members');
  return manifest;
}

/** Refuses a backup made by a newer Kilocycle: its schema has migrations this checkout does not know. */
function checkMigrationsKnown(manifest, archive) {
  const last = manifest.database?.migrations?.last;
  const dir = join(ROOT, 'backend', 'src', 'database', 'migrations');
  if (!last || !existsSync(dir)) return;
  const known = readdirSync(dir)
    .map((f) => /^(\d+)-(\w+)\.ts$/.exec(f))
    .filter(Boolean)
    .map((m) => `${m[2]}${m[1]}`);
  if (!known.includes(last)) {
    throw new Stop(
      `${archive} was made by a newer Kilocycle (its schema ends with migration ${last}, unknown here): update Kilocycle first. Nothing was changed.`,
    );
  }
}

// ---- restore -------------------------------------------------------------------------------------

function nonEmpty(dir) {
  return walk(dir).length;
}

function placeDir(top, dir) {
  const target = join(VAR, dir);
  rmSync(target, { recursive: true, force: true });
  const from = join(top, 'files', dir);
  if (existsSync(from)) cpSync(from, target, { recursive: true });
  else mkdirSync(target, { recursive: true });
  chmodSync(target, 0o700);
  if (dir === 'keys') for (const f of walk(target)) chmodSync(join(target, f), f.endsWith('.key.pem') ? 0o600 : 0o644);
}

function restore(archive, { force, keysOnly }) {
  checkDbName();
  if (!existsSync(archive) || !statSync(archive).isFile()) throw new Stop(`${archive}: no such file`);
  const work = mkdtempSync(join(tmpdir(), 'kilocycle-restore-'));
  let startedDb = false;
  try {
    const manifest = verifyArchive(archive, work);
    const top = join(work, TOP);
    say(`Archive verified: ${manifest.files.length + 1} members match their SHA-256 (made ${manifest.createdAt} from database ${manifest.database.name}).`);

    if (keysOnly) {
      if (!existsSync(join(top, 'files', 'keys'))) throw new Stop(`${archive} holds no signing keys. Nothing was changed.`);
      if (nonEmpty(join(VAR, 'keys')) > 0 && !force) {
        throw new Stop(`${join(VAR, 'keys')} already holds keys; give --force to replace them. Nothing was changed.`);
      }
      mkdirSync(VAR, { recursive: true });
      placeDir(top, 'keys');
      say(`Signing keys restored to ${join(VAR, 'keys')} (key id ${keyIdOf(join(VAR, 'keys', 'certificate-signing.pub.pem')) ?? 'none'}).`);
      return;
    }

    checkMigrationsKnown(manifest, archive);
    const inTheWay = [];
    for (const dir of RECORD_DIRS) {
      const n = nonEmpty(join(VAR, dir));
      if (n > 0) inTheWay.push(`${join(VAR, dir)} (${n} file${n === 1 ? '' : 's'})`);
    }
    // Files first: refusing here needs no database, so a refused restore starts nothing either.
    if (inTheWay.length > 0 && !force) throw refusal(inTheWay);

    mkdirSync(VAR, { recursive: true });
    // The app user's password: a machine keeps its own; a fresh one takes the archived one (see README).
    if (!existsSync(join(VAR, 'db-password')) && existsSync(join(top, 'files', 'db-password'))) {
      copyFileSync(join(top, 'files', 'db-password'), join(VAR, 'db-password'));
      chmodSync(join(VAR, 'db-password'), 0o600);
    }
    if (!dbRunning()) {
      kilocycleDb('start');
      startedDb = true;
    }
    const tables = tableCount();
    if (tables > 0) inTheWay.push(`database ${DB_NAME} (${tables} tables)`);
    if (inTheWay.length > 0 && !force) throw refusal(inTheWay);

    if (inTheWay.length > 0 && tables > 0 && hasSchema()) {
      const before = makeBackup(join(VAR, 'backups'), 'kilocycle-pre-restore');
      say(`What was there is kept in ${before.path}.`);
    } else if (inTheWay.length > 0) {
      const kept = join(VAR, 'backups', `replaced-${utcStamp(new Date())}`);
      mkdirSync(kept, { recursive: true, mode: 0o700 });
      for (const dir of RECORD_DIRS) if (existsSync(join(VAR, dir))) renameSync(join(VAR, dir), join(kept, dir));
      say(`The files that were there are kept in ${kept}.`);
    }

    sql(`DROP DATABASE IF EXISTS \`${DB_NAME}\`; CREATE DATABASE \`${DB_NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`);
    // The dump goes to the client as a file on its standard input: streamed, whatever its size.
    const dumpFd = openSync(join(top, 'database.sql'), 'r');
    let load;
    try {
      load = spawnSync('mariadb', ['--no-defaults', `--socket=${DB_SOCK}`, '-uroot', '--default-character-set=utf8mb4', DB_NAME], {
        stdio: [dumpFd, 'ignore', 'pipe'],
        encoding: 'utf8',
      });
    } finally {
      closeSync(dumpFd);
    }
    if (load.status !== 0) {
      // Leave an empty database rather than half of one, so a retry needs no --force.
      sql(`DROP DATABASE IF EXISTS \`${DB_NAME}\`; CREATE DATABASE \`${DB_NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`);
      const lines = (load.stderr || load.error?.message || '')
        .split('\n')
        .map((l) => l.trim())
        .filter((l) => l && !/^-+$/.test(l));
      throw new Stop(`loading the database failed, database ${DB_NAME} is left empty: ${lines.find((l) => l.startsWith('ERROR')) ?? lines[0] ?? 'no message'}`);
    }
    for (const dir of RECORD_DIRS) placeDir(top, dir);
    if (existsSync(join(top, 'files', 'jwt-secret'))) {
      copyFileSync(join(top, 'files', 'jwt-secret'), join(VAR, 'jwt-secret'));
      chmodSync(join(VAR, 'jwt-secret'), 0o600);
    }

    const counts = restoredCounts();
    const wanted = manifest.database.counts ?? {};
    for (const key of ['certificates', 'readings']) {
      if (typeof wanted[key] === 'number' && counts[key] < wanted[key]) {
        throw new Stop(`the restored database holds ${counts[key]} ${key}, fewer than the ${wanted[key]} the manifest counted`);
      }
    }
    say(`Restored database ${DB_NAME}: ${counts.certificates} certificates (${counts.signedCertificates} signed), ${counts.readings} readings.`);
    say(
      `Restored files: ${RECORD_DIRS.map((d) => `${d} ${nonEmpty(join(VAR, d))}`).join(', ')}; secrets: jwt-secret${existsSync(join(VAR, 'db-password')) ? ', db-password kept as this machine has it' : ''}.`,
    );
    const keyId = keyIdOf(join(VAR, 'keys', 'certificate-signing.pub.pem'));
    const [[otherKeys]] = sql(`SELECT COUNT(*) FROM certificates WHERE signature IS NOT NULL AND key_id <> '${keyId ?? ''}'`, DB_NAME);
    if (Number(otherKeys) > 0) {
      say(`Warning: ${otherKeys} signed certificate(s) carry another key id than the restored key (${keyId ?? 'none'}); their public check will fail.`);
    }
    say('Start the app with bin/kilocycle start (it runs any pending migrations).');
  } finally {
    rmSync(work, { recursive: true, force: true });
    if (startedDb) {
      try {
        kilocycleDb('stop');
      } catch {
        /* the restore's own outcome matters more */
      }
    }
  }
}

function refusal(inTheWay) {
  return new Stop(
    `refusing to overwrite what is there: ${inTheWay.join('; ')}. Give --force to replace it (a backup of it is written to ${join(VAR, 'backups')} first). Nothing was changed.`,
  );
}

// ---- command line --------------------------------------------------------------------------------

function say(line) {
  process.stdout.write(`${line}\n`);
}

function main(argv) {
  const [command, ...rest] = argv;
  if (command === 'backup') {
    const { values, positionals } = parseArgs({ args: rest, options: { to: { type: 'string' } }, allowPositionals: true });
    if (positionals.length > 0) throw new Stop(`unexpected argument "${positionals[0]}" (see bin/kilocycle backup --help)`);
    const { path, manifest } = makeBackup(resolve(values.to ?? join(VAR, 'backups')));
    const c = manifest.database.counts;
    say(`Backup written: ${path}`);
    say(
      `  database ${manifest.database.name}: ${manifest.database.migrations.count} migrations, ${c.certificates} certificates (${c.signedCertificates} signed), ${c.readings} readings; ${manifest.files.length} files with SHA-256.`,
    );
    say('  It holds the signing key and the secrets: copy it off this machine to encrypted, access-controlled storage.');
  } else if (command === 'restore') {
    const { values, positionals } = parseArgs({
      args: rest,
      options: { force: { type: 'boolean' }, 'keys-only': { type: 'boolean' } },
      allowPositionals: true,
    });
    if (positionals.length !== 1) throw new Stop('give one archive: bin/kilocycle restore [--force] [--keys-only] FROM (see bin/kilocycle restore --help)');
    restore(resolve(positionals[0]), { force: values.force === true, keysOnly: values['keys-only'] === true });
  } else {
    throw new Stop(`unknown command "${command ?? ''}" (backup or restore)`);
  }
}

try {
  main(process.argv.slice(2));
} catch (error) {
  const message = error instanceof Error ? error.message : String(error);
  process.stderr.write(`kilocycle: ${error instanceof Stop || error?.code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION' ? message : `unexpected failure: ${message}`}\n`);
  process.exit(1);
}
