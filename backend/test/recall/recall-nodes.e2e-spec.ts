import { SchedulerRegistry } from '@nestjs/schedule';
import { namedLockIsFree } from '../../src/cluster/cluster.module.js';
import { RecallService } from '../../src/recall/recall.service.js';
import { recallLockName } from '../../src/recall/run-recall.js';
import { appWith } from '../support/app-with.js';
import { createTestApp, type TestApp } from '../support/test-app.js';

/** Three app nodes on one database, each with its own mail fake (which stores what it catches in mail_messages). */
describe('recall reminder on several app nodes (e2e, MariaDB)', () => {
  let nodes: TestApp[] = [];
  beforeAll(async () => {
    nodes = [await createTestApp(), await createTestApp({ reset: false }), await createTestApp({ reset: false })];
  });
  afterAll(async () => {
    for (const node of nodes) await node.close();
  });
  const ds = () => nodes[0]!.dataSource;
  const reminderMails = async (): Promise<Array<{ subject: string }>> =>
    ds().query("SELECT subject FROM mail_messages WHERE kind = 'recall_reminder' ORDER BY id");
  const noticeCount = async (): Promise<number> => Number((await ds().query('SELECT COUNT(*) AS n FROM recall_notices'))[0].n);

  it('should send each reminder once when three nodes fire at the same moment, and free the lock afterwards', async () => {
    expect(await reminderMails()).toHaveLength(0);
    const results = await Promise.all(nodes.map((node) => node.app.get(RecallService).scheduledRun()));
    // One node took the lock and sent; a node that found it taken skipped (null). A node that came after the
    // first had finished ran and found nothing left to send.
    const ran = results.filter((r) => r !== null);
    expect(ran.length).toBeGreaterThanOrEqual(1);
    expect(ran.reduce((sum, r) => sum + r.sent, 0)).toBe(2);
    // The demo's two Northgate instruments due within 30 days (N-1041, N-1187): one mail naming both, and nothing twice.
    const mails = await reminderMails();
    expect(mails).toHaveLength(1);
    expect(mails[0]!.subject).toBe('Calibration due soon for 2 instruments');
    expect(await noticeCount()).toBe(2);
    expect(await namedLockIsFree(ds(), recallLockName(ds()))).toBe(true);
  });

  it('should skip the scheduled pass on a node while another holds the lock, and run once it is free', async () => {
    const [n1041] = await ds().query("SELECT id FROM instruments WHERE serial = 'N-1041'");
    const next = new Date(Date.now() + 5 * 86_400_000).toISOString().slice(0, 10);
    await ds().query('UPDATE instruments SET next_due_date = ? WHERE id = ?', [next, n1041.id]);
    const name = recallLockName(ds());
    // Another node's pass, as MariaDB sees it: a connection holding the lock.
    const other = ds().createQueryRunner();
    await other.connect();
    try {
      expect(Number((await other.query('SELECT GET_LOCK(?, 0) AS got', [name]))[0].got)).toBe(1);
      expect(await nodes[1]!.app.get(RecallService).scheduledRun()).toBeNull();
      expect(await reminderMails()).toHaveLength(1);
      expect(await other.query('SELECT RELEASE_LOCK(?) AS released', [name])).toEqual([{ released: 1 }]);
    } finally {
      await other.release();
    }
    const result = await nodes[1]!.app.get(RecallService).scheduledRun();
    expect(result?.sent).toBe(1);
    expect(await reminderMails()).toHaveLength(2);
    expect(await namedLockIsFree(ds(), name)).toBe(true);
  });

  it('should keep the lock per database: a lock of the same purpose on another database does not hold this one back', async () => {
    const name = recallLockName(ds());
    expect(name).toBe(`kc:${String(ds().options.database)}:recall`);
    const other = ds().createQueryRunner();
    await other.connect();
    try {
      expect(Number((await other.query('SELECT GET_LOCK(?, 0) AS got', ['kc:kilocycle_elsewhere:recall']))[0].got)).toBe(1);
      expect(await nodes[2]!.app.get(RecallService).scheduledRun()).toMatchObject({ sent: 0 });
    } finally {
      await other.query('SELECT RELEASE_LOCK(?)', ['kc:kilocycle_elsewhere:recall']);
      await other.release();
    }
  });

  it('should time the first pass with KC_RECALL_DELAY_MS through the scheduler, and send nothing when KC_RECALL_DISABLED is on', async () => {
    expect(nodes[0]!.app.get(SchedulerRegistry).getTimeouts()).toEqual([]);
    const [n1187] = await ds().query("SELECT id FROM instruments WHERE serial = 'N-1187'");
    const next = new Date(Date.now() + 7 * 86_400_000).toISOString().slice(0, 10);
    await ds().query('UPDATE instruments SET next_due_date = ? WHERE id = ?', [next, n1187.id]);
    const timed = await appWith({ KC_RECALL_DISABLED: '0', KC_RECALL_DELAY_MS: '200' }, false);
    try {
      // The recall's first pass, beside the overdue-invoice reminder's, which follows the same switch and delay.
      expect(timed.app.get(SchedulerRegistry).getTimeouts().sort()).toEqual(['invoice-reminders-first', 'recall-first']);
      let mails = await reminderMails();
      for (let i = 0; i < 50 && mails.length < 3; i += 1) {
        await new Promise((resolve) => setTimeout(resolve, 100));
        mails = await reminderMails();
      }
      expect(mails).toHaveLength(3);
      expect(mails[2]!.subject).toContain('N-1187');
      for (let i = 0; i < 50 && timed.app.get(SchedulerRegistry).getTimeouts().length > 0; i += 1) await new Promise((resolve) => setTimeout(resolve, 100));
      expect(timed.app.get(SchedulerRegistry).getTimeouts()).toEqual([]);
      expect(timed.app.get(SchedulerRegistry).getIntervals().sort()).toEqual(['invoice-reminders-daily', 'recall-daily']);
    } finally {
      await timed.close();
    }
  });
});
