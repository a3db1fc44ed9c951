import { REPLICA_REST_MS } from '../../src/database/typeorm-options.js';
import { khzRange, organizationIds } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';
import { caughtUp, startReplicatedPair, type ReplicatedPair } from '../support/throwaway-replication.js';

/** Creates an app with these settings in the environment (its configuration is read while it is built). */
async function appWith(env: Record<string, string>): Promise<TestApp> {
  const saved = Object.fromEntries(Object.keys(env).map((key) => [key, process.env[key]]));
  Object.assign(process.env, env);
  try {
    return await createTestApp();
  } finally {
    for (const [key, value] of Object.entries(saved)) {
      if (value === undefined) delete process.env[key];
      else process.env[key] = value;
    }
  }
}

type InstrumentBody = { id: number; make: string; serial: string };
const LISTS = ['/api/instruments', '/api/jobs', '/api/standards', '/api/organizations', '/api/runs'];

describe('reads from a MariaDB replica (e2e, throwaway primary and GTID replica)', () => {
  let pair: ReplicatedPair;
  let t: TestApp;
  let as: AsDemo;
  let northgate: number;

  beforeAll(async () => {
    pair = await startReplicatedPair();
    t = await appWith({
      KC_DB_HOST: '127.0.0.1',
      KC_DB_PORT: String(pair.primary.port),
      KC_DB_NAME: 'kc',
      KC_DB_USER: 'kc',
      KC_DB_PASSWORD: 'kc-test-pw',
      KC_DB_REPLICA_HOST: '127.0.0.1',
      KC_DB_REPLICA_PORT: String(pair.replica.port),
    });
    as = await signInDemo(t.http);
    northgate = (await organizationIds(t, as('admin')))['Northgate Radio Club']!;
    await caughtUp(pair.primary, pair.replica);
  }, 180_000);
  afterAll(async () => {
    await t?.close();
    await pair?.destroy();
  });

  const newInstrument = (serial: string) => ({
    organizationId: northgate,
    make: 'Pellow',
    model: 'GDO-3 dip oscillator',
    serial,
    ranges: [khzRange('Coil 1', 1700, 4000, [1])],
  });
  /** An instrument's make changed on the replica alone (root may write to a read-only replica): only a read there shows it. */
  const onReplicaOnly = (id: number, make: string) => pair.replica.sql(`UPDATE kc.instruments SET make = '${make}' WHERE id = ${id}`);
  const list = async (q: string) =>
    (await t.http.get(`/api/instruments?q=${encodeURIComponent(q)}`).set(as('tech'))).body as { total: number; items: InstrumentBody[] };

  it('should serve lists and single records from the replica', async () => {
    const [first] = (await list('')).items;
    const original = pair.primary.value(`SELECT make FROM kc.instruments WHERE id = ${first!.id}`);
    onReplicaOnly(first!.id, 'Seen on the replica only');
    try {
      const found = await list('Seen on the replica only');
      expect(found.items.map((i) => i.id)).toEqual([first!.id]);
      expect((await t.http.get(`/api/instruments/${first!.id}`).set(as('tech'))).body.make).toBe('Seen on the replica only');
      // The primary never had it.
      expect(pair.primary.value(`SELECT make FROM kc.instruments WHERE id = ${first!.id}`)).toBe(original);
    } finally {
      onReplicaOnly(first!.id, original);
    }
  });

  it("should read a run's readings and its analysis from the replica", async () => {
    const runId = Number(pair.primary.value("SELECT id FROM kc.runs WHERE kind = 'warmup' AND reading_count > 100 ORDER BY id LIMIT 1"));
    const count = Number(pair.primary.value(`SELECT reading_count FROM kc.runs WHERE id = ${runId}`));
    const last = pair.primary.row(`SELECT seq, t_s, frequency_hz FROM kc.readings WHERE run_id = ${runId} ORDER BY seq DESC LIMIT 1`);
    const [lastSeq, lastT, lastF] = [Number(last.seq), Number(last.t_s), Number(last.frequency_hz)];
    // Readings are never changed or removed (a trigger says so), so one more is written on the replica alone: only a read
    // there sees it. It stays there; no later test reads this run.
    const frequency = lastF + 0.125;
    pair.replica.sql(
      `INSERT INTO kc.readings (run_id, seq, t_s, dial, frequency_hz, aux, source) VALUES (${runId}, ${lastSeq + 1}, ${lastT + 1}, NULL, ${frequency}, NULL, 'manual')`,
    );
    const page = await t.http.get(`/api/runs/${runId}/readings?sort=-seq&pageSize=1`).set(as('tech'));
    expect(page.body.items[0]).toMatchObject({ seq: lastSeq + 1, frequency });
    const analysis = await t.http.get(`/api/runs/${runId}/analysis`).set(as('tech'));
    expect(analysis.status).toBe(200);
    expect(analysis.body.readingCount).toBe(count + 1);
    expect(Number(pair.primary.value(`SELECT COUNT(*) FROM kc.readings WHERE run_id = ${runId}`))).toBe(count);
  });

  it('should write to the primary, and answer a write with what was written (read after write)', async () => {
    const created = await t.http.post('/api/instruments').set(as('tech')).send(newInstrument('RPL-1'));
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ serial: 'RPL-1', make: 'Pellow' });
    expect(pair.primary.value(`SELECT serial FROM kc.instruments WHERE id = ${created.body.id}`)).toBe('RPL-1');
    await caughtUp(pair.primary, pair.replica);
    expect(pair.replica.value(`SELECT serial FROM kc.instruments WHERE id = ${created.body.id}`)).toBe('RPL-1');
  });

  it('should read from the primary while the replica is behind (replication stopped), then return to the replica', async () => {
    pair.replica.sql('STOP SLAVE');
    try {
      const started = Date.now();
      const created = await t.http.post('/api/instruments').set(as('tech')).send(newInstrument('RPL-2'));
      expect(created.status).toBe(201);
      expect(created.body.serial).toBe('RPL-2');
      expect((await list('RPL-2')).total).toBe(1);
      expect(Date.now() - started).toBeLessThan(2000);
      // The replica has not got it: those reads were the primary's.
      expect(pair.replica.value("SELECT COUNT(*) FROM kc.instruments WHERE serial = 'RPL-2'")).toBe('0');
    } finally {
      pair.replica.sql('START SLAVE');
    }
    await caughtUp(pair.primary, pair.replica);
    await new Promise((resolve) => setTimeout(resolve, REPLICA_REST_MS + 200));
    const [first] = (await list('')).items;
    onReplicaOnly(first!.id, 'Back on the replica');
    try {
      expect((await list('Back on the replica')).total).toBe(1);
    } finally {
      onReplicaOnly(first!.id, first!.make);
    }
  });

  it('should answer every list from the primary within two seconds while the replica is stopped, and go back to the replica once it returns', async () => {
    await pair.replica.stop();
    for (let round = 0; round < 2; round++) {
      for (const path of LISTS) {
        const started = Date.now();
        const res = await t.http.get(path).set(as('lead'));
        expect([path, res.status]).toEqual([path, 200]);
        expect(Date.now() - started).toBeLessThan(2000);
      }
    }
    // Writes never needed the replica.
    expect((await t.http.post('/api/instruments').set(as('tech')).send(newInstrument('RPL-3'))).status).toBe(201);
    expect((await list('RPL-3')).total).toBe(1);

    await pair.replica.start();
    await caughtUp(pair.primary, pair.replica);
    await new Promise((resolve) => setTimeout(resolve, REPLICA_REST_MS + 200));
    const [first] = (await list('RPL-3')).items;
    onReplicaOnly(first!.id, 'Replica restarted');
    try {
      expect((await list('Replica restarted')).total).toBe(1);
    } finally {
      onReplicaOnly(first!.id, first!.make);
    }
  }, 60_000);
});
