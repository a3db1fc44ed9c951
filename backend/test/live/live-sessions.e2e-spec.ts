import { createHmac, randomUUID } from 'node:crypto';
import type { Socket } from 'socket.io-client';
import { LIVE_EVENTS, NAMESPACES, type JoinReply, type LeaveReply } from '@kilocycle/common/events';
import { loadConfig } from '../../src/config/app-config.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { connect, createBench, createRun, listen, organizationId, request, type RunFixture } from '../ingest/ingest-fixtures.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

/**
 * Sessions end when they should, on REST and on /live sockets: sign-out, deactivation (of the account
 * or its organisation), a role change and a password change each close the user's joined sockets
 * within a second and the old token then gets 401; a socket closes when its token expires; only HS256
 * tokens are accepted. Tokens are forged here with node's own HMAC, not with the app's signer.
 */
describe('/live sessions end when they should (e2e, MariaDB)', () => {
  let t: TestApp;
  let url: string;
  let run: RunFixture;
  let admin: { Authorization: string };
  let labId: number;
  let sockets: Socket[] = [];
  const secret = loadConfig().jwtSecret;

  beforeAll(async () => {
    t = await createTestApp();
    url = await listen(t);
    const bench = await createBench(t.dataSource);
    run = await createRun(t.dataSource, { organizationId: await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: bench.benchId });
    admin = { Authorization: `Bearer ${await tokenFor(t.http, DEMO.admin)}` };
    const [lab] = await t.dataSource.query("SELECT id FROM organizations WHERE kind = 'lab' LIMIT 1");
    labId = Number(lab.id);
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await t.close();
  });

  /** A new lab account (so no test leans on another's demo account) and its first session's token. */
  async function newAccount(options: { role?: string; organizationId?: number } = {}): Promise<{ id: number; email: string; password: string; token: string }> {
    const email = `session-${randomUUID().slice(0, 8)}@kilocycle.test`;
    const password = `Harbour-${randomUUID()}`;
    const res = await t.http
      .post('/api/users')
      .set(admin)
      .send({ email, name: 'Session Tester', role: options.role ?? 'technician', organizationId: options.organizationId ?? labId, password });
    if (res.status !== 201) throw new Error(`creating ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return { id: res.body.id as number, email, password, token: await tokenFor(t.http, email, password) };
  }

  async function joined(token: string): Promise<Socket> {
    const socket = await connect(url, NAMESPACES.live, token, sockets);
    expect(await request<JoinReply>(socket, LIVE_EVENTS.join, { runId: run.runId })).toMatchObject({ ok: true, runId: run.runId });
    return socket;
  }

  /** Resolves with the reason and the moment the server closes the socket. */
  function closing(socket: Socket): Promise<{ reason: string; at: number }> {
    return new Promise((resolve) => socket.once('disconnect', (reason) => resolve({ reason, at: Date.now() })));
  }

  /**
   * Runs `end` (the REST call that ends the session), then asserts the server closed the socket within
   * 1 s of answering it (the close may come before the answer). The call itself (a bcrypt hash for a new
   * password) is not counted: that is the change, not the cut.
   */
  async function expectCutWithinOneSecond(socket: Socket, end: () => Promise<unknown>): Promise<void> {
    const closed = closing(socket);
    await end();
    const answered = Date.now();
    const within = new Promise<never>((_, reject) => setTimeout(() => reject(new Error('the socket was still open 1 s after the change')), 1000));
    const { reason, at } = await Promise.race([closed, within]);
    expect(reason).toBe('io server disconnect');
    expect(at - answered).toBeLessThan(1000);
  }

  const me = (token: string) => t.http.get('/api/auth/me').set('Authorization', `Bearer ${token}`);

  /** A compact JWS made with node's HMAC (RFC 7515 §3.1), independent of the app's signer. */
  function forge(claims: Record<string, unknown>, alg: 'HS256' | 'HS512'): string {
    const part = (value: unknown) => Buffer.from(JSON.stringify(value)).toString('base64url');
    const body = `${part({ alg, typ: 'JWT' })}.${part(claims)}`;
    const signature = createHmac(alg === 'HS256' ? 'sha256' : 'sha512', secret)
      .update(body)
      .digest('base64url');
    return `${body}.${signature}`;
  }

  async function claimsFor(account: { id: number }, seconds: number): Promise<Record<string, unknown>> {
    const [row] = await t.dataSource.query('SELECT token_version AS tv FROM users WHERE id = ?', [account.id]);
    const now = Math.floor(Date.now() / 1000);
    return { sub: account.id, role: 'technician', org: labId, jti: randomUUID(), tv: Number(row.tv), iat: now, exp: now + seconds };
  }

  it("should cut a joined socket within 1 s of sign-out, refuse the old token, and keep the user's other sessions", async () => {
    const account = await newAccount();
    const other = await tokenFor(t.http, account.email, account.password);
    const page = await joined(account.token);
    const otherPage = await joined(other);
    await expectCutWithinOneSecond(page, () => t.http.post('/api/auth/logout').set('Authorization', `Bearer ${account.token}`).expect(204));
    expect((await me(account.token)).status).toBe(401);
    // Sign-out ends this session only: the same user's other sign-in keeps working, socket included.
    expect((await me(other)).status).toBe(200);
    expect(otherPage.connected).toBe(true);
    expect(await request<LeaveReply>(otherPage, LIVE_EVENTS.leave, { runId: run.runId })).toEqual({ ok: true, runId: run.runId });
  });

  it('should cut every socket of a deactivated user within 1 s, refuse the old token, and leave other users alone', async () => {
    const account = await newAccount();
    const second = await joined(await tokenFor(t.http, account.email, account.password));
    const page = await joined(account.token);
    const bystander = await joined(await tokenFor(t.http, DEMO.tech));
    const secondClosed = closing(second);
    await expectCutWithinOneSecond(page, () => t.http.patch(`/api/users/${account.id}`).set(admin).send({ active: false }).expect(200));
    expect((await secondClosed).reason).toBe('io server disconnect');
    expect((await me(account.token)).status).toBe(401);
    expect(bystander.connected).toBe(true);
    // Reactivation does not bring the old session back: the version moved on.
    await t.http.patch(`/api/users/${account.id}`).set(admin).send({ active: true }).expect(200);
    expect((await me(account.token)).status).toBe(401);
  });

  it('should cut the socket within 1 s of a password change; the old token gets 401 and the new password signs in', async () => {
    const account = await newAccount();
    const page = await joined(account.token);
    const password = `Lighthouse-${randomUUID()}`;
    await expectCutWithinOneSecond(page, () => t.http.patch(`/api/users/${account.id}`).set(admin).send({ password }).expect(200));
    expect((await me(account.token)).status).toBe(401);
    await expect(connect(url, NAMESPACES.live, account.token, sockets)).rejects.toMatchObject({ data: { code: 'bad_session' } });
    const fresh = await tokenFor(t.http, account.email, password);
    expect((await me(fresh)).status).toBe(200);
  });

  it('should cut the socket within 1 s of a role change, and refuse the old token', async () => {
    const account = await newAccount();
    const page = await joined(account.token);
    await expectCutWithinOneSecond(page, () => t.http.patch(`/api/users/${account.id}`).set(admin).send({ role: 'lead' }).expect(200));
    expect((await me(account.token)).status).toBe(401);
  });

  it('should not end sessions for a change of name only', async () => {
    const account = await newAccount();
    const page = await joined(account.token);
    await t.http.patch(`/api/users/${account.id}`).set(admin).send({ name: 'Renamed Tester' }).expect(200);
    expect((await me(account.token)).body).toMatchObject({ name: 'Renamed Tester' });
    expect(page.connected).toBe(true);
  });

  it("should cut a client's socket within 1 s when its organisation is deactivated", async () => {
    const org = await t.http
      .post('/api/organizations')
      .set(admin)
      .send({ name: `Session Test Co ${randomUUID().slice(0, 6)}`, kind: 'customer' });
    expect(org.status).toBe(201);
    const client = await newAccount({ role: 'client', organizationId: org.body.id as number });
    const page = await connect(url, NAMESPACES.live, client.token, sockets);
    await expectCutWithinOneSecond(page, () => t.http.patch(`/api/organizations/${org.body.id}`).set(admin).send({ active: false }).expect(200));
    expect((await me(client.token)).status).toBe(401);
  });

  it('should check the session again on every socket event, not only at connect', async () => {
    const account = await newAccount();
    const page = await joined(account.token);
    const closed = closing(page);
    // Raised behind the app's back (as another node would): no event tells this node, the next leave finds out.
    await t.dataSource.query('UPDATE users SET token_version = token_version + 1 WHERE id = ?', [account.id]);
    expect(await request<LeaveReply>(page, LIVE_EVENTS.leave, { runId: run.runId })).toMatchObject({ ok: false, code: 'forbidden' });
    expect((await closed).reason).toBe('io server disconnect');
  });

  it('should accept only HS256: a token with the same secret and claims signed with HS512 gets 401 and no socket', async () => {
    const account = await newAccount();
    const claims = await claimsFor(account, 600);
    // The control: the very same claims signed HS256 are a valid session, so the forging is right.
    expect((await me(forge(claims, 'HS256'))).status).toBe(200);
    const hs512 = forge({ ...claims, jti: randomUUID() }, 'HS512');
    const res = await me(hs512);
    expect(res.status).toBe(401);
    expect(res.body.message).toMatch(/not valid|expired/);
    await expect(connect(url, NAMESPACES.live, hs512, sockets)).rejects.toMatchObject({ data: { code: 'bad_session' } });
  });

  it('should refuse a token without the version claim (issued before versions existed)', async () => {
    const account = await newAccount();
    const { tv: _tv, ...claims } = await claimsFor(account, 600);
    expect((await me(forge(claims, 'HS256'))).status).toBe(401);
  });

  it('should drop a socket when its token expires', async () => {
    const account = await newAccount();
    const claims = await claimsFor(account, 2);
    const page = await joined(forge(claims, 'HS256'));
    const { reason, at } = await closing(page);
    expect(reason).toBe('io server disconnect');
    // Closed at the exp claim (whole seconds), not long after it.
    expect(at).toBeGreaterThanOrEqual((claims.exp as number) * 1000);
    expect(at - (claims.exp as number) * 1000).toBeLessThan(500);
  });
});
