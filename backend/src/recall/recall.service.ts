import { ConflictException, Inject, Injectable, Logger, type OnApplicationBootstrap } from '@nestjs/common';
import { SchedulerRegistry } from '@nestjs/schedule';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import type { ListResponse, RecallNotice, RecallRunResult } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { withNamedLock } from '../cluster/cluster.module.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { RecallInstrumentsReader } from '../instruments/recall-instruments.reader.js';
import { MailService } from '../mail/mail.service.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { MANUAL_RUN_WAIT_S, recallLockName, runRecall } from './run-recall.js';

const DAY_MS = 86_400_000;

/**
 * The daily recall reminder: first run shortly after start (KC_RECALL_DELAY_MS, default 60 s), then every 24 h,
 * timed through @nestjs/schedule's registry (cleared at shutdown). With several app nodes each node keeps its
 * own timer, and each pass holds MariaDB's named lock `kc:<database>:recall` (withNamedLock): a node that
 * finds it taken skips that pass, so the reminders of one customer go out in one mail, once.
 */
@Injectable()
export class RecallService implements OnApplicationBootstrap {
  private readonly logger = new Logger('Recall');
  private running: Promise<RecallRunResult | null> | null = null;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly mail: MailService,
    private readonly audit: AuditService,
    private readonly instruments: RecallInstrumentsReader,
    private readonly organizations: OrganizationsReader,
    private readonly scheduler: SchedulerRegistry,
  ) {}

  onApplicationBootstrap(): void {
    // Off when KC_RECALL_DISABLED is on (the test app sets it; tests call scheduledRun() and run()).
    if (this.config.recall.disabled) return;
    const tick = () => {
      this.scheduledRun().catch((error: unknown) => this.logger.error(`recall reminder failed: ${error instanceof Error ? error.message : String(error)}`));
    };
    const first = setTimeout(() => {
      this.scheduler.deleteTimeout('recall-first');
      tick();
      const daily = setInterval(tick, DAY_MS);
      daily.unref();
      this.scheduler.addInterval('recall-daily', daily);
    }, this.config.recall.delayMs);
    first.unref();
    this.scheduler.addTimeout('recall-first', first);
  }

  /**
   * What the schedule runs: one pass if no other node (or `bin/kilocycle remind`) is running one now, else
   * nothing (null, and one line in the log). Exported for tests, which call it on several nodes at once.
   */
  async scheduledRun(now?: Date): Promise<RecallRunResult | null> {
    const result = await this.pass(null, 0, now);
    if (!result) this.logger.log(`recall reminder skipped on this node: another node holds the lock ${recallLockName(this.dataSource)} and is sending them`);
    return result;
  }

  /** One pass asked for by a person: waits up to MANUAL_RUN_WAIT_S for another node's pass, then 409. */
  async run(actorId: number | null, now?: Date): Promise<RecallRunResult> {
    const result = await this.pass(actorId, MANUAL_RUN_WAIT_S, now);
    if (!result) throw new ConflictException(`another app node has been sending the recall reminders for over ${MANUAL_RUN_WAIT_S} s; try again in a minute`);
    return result;
  }

  /** One pass under the named lock; callers on this node while one runs share it. Null when the lock stayed taken. */
  private pass(actorId: number | null, waitSeconds: number, now?: Date): Promise<RecallRunResult | null> {
    if (!this.running) {
      this.running = withNamedLock(this.dataSource, recallLockName(this.dataSource), waitSeconds, () =>
        runRecall(this.dataSource, (mail) => this.mail.mailer.send(mail), { publicUrl: this.config.publicUrl, now }),
      )
        .then(async (outcome) => {
          if (!outcome.acquired) return null;
          const result = outcome.result;
          if (result.sent > 0) {
            await this.audit.record({
              actorId,
              entity: 'recall',
              entityId: 'reminder',
              action: 'send',
              changes: { sent: result.sent, instruments: result.notices.map((n) => n.instrumentId) },
            });
            this.logger.log(`recall reminders sent for ${result.sent} instrument(s)`);
          }
          return result;
        })
        .finally(() => {
          this.running = null;
        });
    }
    return this.running;
  }

  async list(page = 1, pageSize = 25): Promise<ListResponse<RecallNotice>> {
    const [{ total }] = await this.dataSource.query('SELECT COUNT(*) AS total FROM recall_notices');
    const rows: Array<Record<string, unknown>> = await this.dataSource.query(
      "SELECT id, instrument_id, DATE_FORMAT(due_date, '%Y-%m-%d') AS due, recipients, sent_at FROM recall_notices ORDER BY id DESC LIMIT ? OFFSET ?",
      [pageSize, (page - 1) * pageSize],
    );
    // The instruments and their customers from their owners (a page holds at most a few dozen notices).
    const instruments = await this.instruments.byIds(rows.map((r) => Number(r.instrument_id)));
    const organizations = await this.organizations.byIds([...instruments.values()].map((i) => i.organizationId));
    return {
      total: Number(total),
      items: rows.map((r) => {
        const instrument = instruments.get(Number(r.instrument_id))!;
        return {
          id: Number(r.id),
          instrumentId: instrument.id,
          instrumentLabel: `${instrument.make} ${instrument.model}, serial ${instrument.serial}`,
          organizationId: instrument.organizationId,
          organizationName: organizations.get(instrument.organizationId)?.name ?? '',
          dueDate: String(r.due),
          recipients: (typeof r.recipients === 'string' ? JSON.parse(r.recipients) : r.recipients) as string[],
          sentAt: new Date(r.sent_at as string).toISOString(),
        };
      }),
    };
  }
}
