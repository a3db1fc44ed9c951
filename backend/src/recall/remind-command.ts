import type { DataSource } from 'typeorm';
import type { AppConfig } from '../config/config.module.js';
import { Mailer } from '../mail/mail.service.js';
import { withNamedLock } from '../cluster/cluster.module.js';
import { MANUAL_RUN_WAIT_S, recallLockName, runRecall } from './run-recall.js';

/**
 * `kilocycle remind`: one pass of the recall reminder outside the app. Without KC_SMTP_HOST the mail goes
 * to a mail fake started for the duration, which stores it in the outbox like the app's does. Holds the
 * reminder's named lock like the app's scheduled pass.
 */
export async function runRemindCommand(dataSource: DataSource, config: Pick<AppConfig, 'publicUrl'>): Promise<string> {
  const mailer = new Mailer(dataSource);
  await mailer.start();
  try {
    // The same named lock as the app's scheduled pass: never two passes at once, on any node.
    const outcome = await withNamedLock(dataSource, recallLockName(dataSource), MANUAL_RUN_WAIT_S, () =>
      runRecall(dataSource, (mail) => mailer.send(mail), { publicUrl: config.publicUrl }),
    );
    if (!outcome.acquired)
      return `Recall reminders: an app node has been sending them for over ${MANUAL_RUN_WAIT_S} s; nothing was sent here, try again in a minute`;
    const result = outcome.result;
    const lines = [`Recall reminders: ${result.sent} sent, ${result.checked} due without a reminder, ${result.skipped} skipped`];
    for (const n of result.notices) lines.push(`  ${n.dueDate}  ${n.instrumentLabel} (${n.organizationName}) → ${n.recipients.join(', ')}`);
    if (mailer.usesFake) lines.push('Mail went to the local mail fake: see the outbox (GET /api/mail).');
    return lines.join('\n');
  } finally {
    await mailer.stop();
  }
}
