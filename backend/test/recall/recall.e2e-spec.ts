import { loadConfig } from '../../src/config/app-config.js';
import { runRemindCommand } from '../../src/recall/remind-command.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

describe('recall reminders (e2e, MariaDB)', () => {
  let t: TestApp;
  let admin: { Authorization: string };
  beforeAll(async () => {
    t = await createTestApp();
    admin = { Authorization: `Bearer ${await tokenFor(t.http, DEMO.admin)}` };
  });
  afterAll(async () => {
    await t.close();
  });
  const reminders = async (): Promise<Array<{ to: string[]; subject: string }>> =>
    (await t.http.get('/api/mail?kind=recall_reminder&pageSize=100').set(admin)).body.items;
  const dueOf = async (serial: string): Promise<{ id: number; due: string }> => {
    const [row] = await t.dataSource.query("SELECT id, DATE_FORMAT(next_due_date, '%Y-%m-%d') AS due FROM instruments WHERE serial = ?", [serial]);
    return { id: Number(row.id), due: row.due as string };
  };

  it('should mail each customer once for its instruments due within 30 days (overdue included)', async () => {
    const res = await t.http.post('/api/recall/run').set(admin);
    expect(res.status).toBe(200);
    const serials = res.body.notices.map((n: { instrumentLabel: string }) => n.instrumentLabel.split('serial ')[1]).sort();
    // N-1041 is due in 20 days, N-1187 10 days ago; the VFO (N-0952) not for a year, the lab's reference in 150 days.
    expect(serials).toEqual(['N-1041', 'N-1187']);
    const mails = await reminders();
    expect(mails).toHaveLength(1);
    expect(mails[0]!.to.sort()).toEqual(['client@northgate.test', 'secretary@northgate.test']);
    expect(mails[0]!.subject).toBe('Calibration due soon for 2 instruments');
  });

  it('should send nothing the second time for the same due dates', async () => {
    const res = await t.http.post('/api/recall/run').set(admin);
    expect(res.body.sent).toBe(0);
    expect(await reminders()).toHaveLength(1);
  });

  it('should remind again when the due date changes, also from the command line', async () => {
    const n1041 = await dueOf('N-1041');
    const next = new Date(Date.now() + 5 * 86_400_000).toISOString().slice(0, 10);
    await t.dataSource.query('UPDATE instruments SET next_due_date = ? WHERE id = ?', [next, n1041.id]);
    const output = await runRemindCommand(t.dataSource, loadConfig());
    expect(output).toContain('1 sent');
    expect(output).toContain('N-1041');
    const mails = await reminders();
    expect(mails).toHaveLength(2);
    expect(mails[0]!.subject).toContain('N-1041');
    expect(mails[0]!.subject).toContain(next);
    expect(await runRemindCommand(t.dataSource, loadConfig())).toContain('0 sent');
    const notices = await t.dataSource.query('SELECT COUNT(*) AS n FROM recall_notices WHERE instrument_id = ?', [n1041.id]);
    expect(Number(notices[0].n)).toBe(2);
  });

  it('should list the notices for the lead and refuse the run to anyone but the admin', async () => {
    const lead = { Authorization: `Bearer ${await tokenFor(t.http, DEMO.lead)}` };
    const list = await t.http.get('/api/recall/notices').set(lead);
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(3);
    expect(list.body.items[0]).toMatchObject({ organizationName: 'Northgate Radio Club' });
    expect((await t.http.post('/api/recall/run').set(lead)).status).toBe(403);
  });
});
