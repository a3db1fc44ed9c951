import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { REPO_ROOT } from '../../src/config/app-config.js';
import { startNode } from '../bridge/processes.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

// Issue #13, item 6: settings read through one schema, a bad start refused, the recall timer really runs.
const MAIN = join(REPO_ROOT, 'backend', 'dist', 'main.js');
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('settings at start (e2e)', () => {
  const saved = { ...process.env };
  let t: TestApp | null = null;
  afterEach(async () => {
    await t?.close();
    t = null;
    process.env = { ...saved };
  });

  const notices = async (app: TestApp) => Number((await app.dataSource.query('SELECT COUNT(*) AS n FROM recall_notices'))[0].n);

  it('should refuse to start with bad settings, listing each bad key, its value and what it must be, without a stack trace', async () => {
    if (!existsSync(MAIN)) throw new Error(`${MAIN} is missing: build first (npm run build -w common && npm run build -w backend)`);
    const child = startNode(MAIN, [], {
      KC_PORT: '0',
      KC_JWT_TTL: '86400x',
      KC_RECALL_DISABLED: 'perhaps',
      KC_DB_PORT: '3317',
      KC_MODE: 'prod',
      KC_UNHEARD_OF: '1',
    });
    let timer: NodeJS.Timeout | undefined;
    const code = await Promise.race([child.exited, new Promise<'timeout'>((resolve) => (timer = setTimeout(() => resolve('timeout'), 20_000)))]);
    clearTimeout(timer);
    if (code === 'timeout') child.process.kill();
    expect(code).toBe(2);
    const err = child.stderr();
    expect(err).toContain('Kilocycle will not start: Configuration problems (4)');
    expect(err).toContain('KC_PORT must be a whole number from 1 to 65535 (got "0")');
    expect(err).toContain('KC_JWT_TTL must be a number of seconds from 60 to 2592000 (got "86400x")');
    expect(err).toContain('KC_RECALL_DISABLED must be 1, true, yes or on to turn it on; 0, false, no or off to turn it off (got "perhaps")');
    expect(err).toContain('KC_MODE must be demo or production (got "prod")');
    expect(err).toContain('KC_UNHEARD_OF is not a Kilocycle setting');
    expect(err).not.toMatch(/^\s+at /m);
    expect(child.stdout()).not.toContain('is serving');
  });

  it('should keep the recall timer off with KC_RECALL_DISABLED=1 and honour KC_JWT_TTL=86400', async () => {
    Object.assign(process.env, { KC_RECALL_DISABLED: '1', KC_RECALL_DELAY_MS: '100', KC_JWT_TTL: '86400' });
    t = await createTestApp();
    await sleep(1500);
    expect(await notices(t)).toBe(0);
    const token = await tokenFor(t.http, DEMO.tech);
    const claims = JSON.parse(Buffer.from(token.split('.')[1]!, 'base64url').toString('utf8')) as { iat: number; exp: number };
    expect(claims.exp - claims.iat).toBe(86_400);
  });

  it('should run the real recall timer after KC_RECALL_DELAY_MS when KC_RECALL_DISABLED=0', async () => {
    // The previous test left the demo data with no notices sent; the timer's first run sends them.
    Object.assign(process.env, { KC_RECALL_DISABLED: '0', KC_RECALL_DELAY_MS: '100' });
    t = await createTestApp({ reset: false });
    expect(await notices(t)).toBe(0);
    // The run ends with its audit event (no actor: the timer); wait for it, then look at what it did.
    const sent = () =>
      t!.dataSource.query("SELECT actor_id FROM audit_events WHERE entity = 'recall' AND action = 'send'") as Promise<Array<{ actor_id: number | null }>>;
    const until = Date.now() + 15_000;
    while ((await sent()).length === 0 && Date.now() < until) await sleep(100);
    expect(await sent()).toEqual([{ actor_id: null }]);
    // The demo data has two Northgate instruments due within 30 days (see test/recall).
    expect(await notices(t)).toBe(2);
  });
});
