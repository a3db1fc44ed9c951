import { ConflictException, Inject, Injectable, Logger, type OnApplicationBootstrap } from '@nestjs/common';
import { SchedulerRegistry } from '@nestjs/schedule';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import { formatMoney, invoiceBalance } from '@kilocycle/common/money';
import { AuditService } from '../audit/audit.service.js';
import { namedLockName, withNamedLock } from '../cluster/cluster.module.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { invoiceOverdueMail, MailService } from '../mail/mail.service.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { todayIso } from '../shared/dto-helpers.js';
import { CertificateRecipientsReader } from '../users/certificate-recipients.reader.js';
import { OVERDUE_SQL } from './invoice-views.js';
import { Invoice } from './invoice.entity.js';

const DAY_MS = 86_400_000;
/** An overdue invoice is mailed at most once in this many days. */
export const REMINDER_INTERVAL_DAYS = 7;
const MANUAL_RUN_WAIT_S = 20;

export type OverdueReminderResult = { checked: number; sent: number; invoiceIds: number[] };

/**
 * The daily overdue reminder, timed like the recall reminder (same switch and first delay: KC_RECALL_DISABLED,
 * KC_RECALL_DELAY_MS; then every 24 h) and run under MariaDB's named lock `kc:<database>:invoice-reminders`, so with
 * several app nodes one pass runs at a time. Each overdue invoice is mailed to the customer's contact address and
 * its clients at most once in REMINDER_INTERVAL_DAYS: the invoice's reminded_at is claimed before the mail goes
 * and put back if the mail fails.
 */
@Injectable()
export class OverdueRemindersService implements OnApplicationBootstrap {
  private readonly logger = new Logger('InvoiceReminders');
  private running: Promise<OverdueReminderResult | null> | null = null;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly mail: MailService,
    private readonly audit: AuditService,
    private readonly organizations: OrganizationsReader,
    private readonly recipients: CertificateRecipientsReader,
    private readonly scheduler: SchedulerRegistry,
  ) {}

  onApplicationBootstrap(): void {
    if (this.config.recall.disabled) return;
    const tick = () => {
      this.scheduledRun().catch((error: unknown) => this.logger.error(`overdue reminder failed: ${error instanceof Error ? error.message : String(error)}`));
    };
    const first = setTimeout(() => {
      this.scheduler.deleteTimeout('invoice-reminders-first');
      tick();
      const daily = setInterval(tick, DAY_MS);
      daily.unref();
      this.scheduler.addInterval('invoice-reminders-daily', daily);
    }, this.config.recall.delayMs);
    first.unref();
    this.scheduler.addTimeout('invoice-reminders-first', first);
  }

  lockName(): string {
    return namedLockName(this.dataSource, 'invoice-reminders');
  }

  /** What the schedule runs: one pass unless another node is running one (null). */
  async scheduledRun(now?: Date): Promise<OverdueReminderResult | null> {
    const result = await this.pass(null, 0, now);
    if (!result) this.logger.log(`overdue reminder skipped on this node: another node holds the lock ${this.lockName()}`);
    return result;
  }

  /** One pass asked for by a person (POST /invoices/overdue-reminders/run): waits for another node's pass, then 409. */
  async run(actorId: number | null, now?: Date): Promise<OverdueReminderResult> {
    const result = await this.pass(actorId, MANUAL_RUN_WAIT_S, now);
    if (!result) throw new ConflictException(`another app node has been sending the overdue reminders for over ${MANUAL_RUN_WAIT_S} s; try again in a minute`);
    return result;
  }

  private pass(actorId: number | null, waitSeconds: number, now?: Date): Promise<OverdueReminderResult | null> {
    if (!this.running) {
      this.running = withNamedLock(this.dataSource, this.lockName(), waitSeconds, () => this.remind(actorId, now ?? new Date()))
        .then((outcome) => (outcome.acquired ? outcome.result : null))
        .finally(() => {
          this.running = null;
        });
    }
    return this.running;
  }

  private async remind(actorId: number | null, now: Date): Promise<OverdueReminderResult> {
    const lastAllowed = new Date(now.getTime() - REMINDER_INTERVAL_DAYS * DAY_MS);
    const due = await this.dataSource
      .getRepository(Invoice)
      .createQueryBuilder('i')
      .where(OVERDUE_SQL, { today: todayIso(now) })
      .andWhere('(i.reminded_at IS NULL OR i.reminded_at <= :lastAllowed)', { lastAllowed })
      .orderBy('i.id', 'ASC')
      .getMany();
    const lab = await this.organizations.lab();
    const customers = await this.organizations.byIds(due.map((i) => i.organizationId));
    const sent: number[] = [];
    for (const invoice of due) {
      const customer = customers.get(invoice.organizationId);
      if (!customer?.active) continue;
      const to = [...new Set([customer.contactEmail, ...(await this.recipients.clientEmails(invoice.organizationId))].filter((e): e is string => !!e))];
      if (to.length === 0) continue;
      // Claimed first, so a second pass (another node, the button) never mails the same invoice again this week.
      const claim = await this.dataSource.query('UPDATE invoices SET reminded_at = ? WHERE id = ? AND (reminded_at IS NULL OR reminded_at <= ?)', [
        now,
        invoice.id,
        lastAllowed,
      ]);
      if (Number(claim.affectedRows) !== 1) continue;
      try {
        await this.mail.mailer.send(
          invoiceOverdueMail({
            to,
            labName: lab?.name ?? 'The laboratory',
            customer: customer.name,
            number: invoice.number ?? '',
            dueDate: String(invoice.dueDate).slice(0, 10),
            balance: formatMoney(invoiceBalance(invoice), invoice.currency),
            invoiceUrl: `${this.config.publicUrl}/portal/invoices/${invoice.id}`,
          }),
        );
      } catch (error) {
        await this.dataSource.query('UPDATE invoices SET reminded_at = ? WHERE id = ?', [invoice.remindedAt, invoice.id]);
        this.logger.error(`overdue reminder for invoice ${invoice.number} not sent: ${error instanceof Error ? error.message : String(error)}`);
        continue;
      }
      await this.audit.record({ actorId, entity: 'invoice', entityId: invoice.id, action: 'remind', changes: { to, dueDate: invoice.dueDate } });
      sent.push(invoice.id);
    }
    if (sent.length > 0) this.logger.log(`overdue reminders sent for ${sent.length} invoice(s)`);
    return { checked: due.length, sent: sent.length, invoiceIds: sent };
  }
}
