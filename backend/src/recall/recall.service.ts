import { Inject, Injectable, Logger, type OnApplicationBootstrap, type OnApplicationShutdown } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import type { ListResponse, RecallNotice, RecallRunResult } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { RecallInstrumentsReader } from '../instruments/recall-instruments.reader.js';
import { MailService } from '../mail/mail.service.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { runRecall } from './run-recall.js';

const DAY_MS = 86_400_000;

/** The daily recall reminder: first run shortly after start (KC_RECALL_DELAY_MS, default 60 s), then every 24 h. */
@Injectable()
export class RecallService implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('Recall');
  private timers: NodeJS.Timeout[] = [];
  private running: Promise<RecallRunResult> | null = null;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly mail: MailService,
    private readonly audit: AuditService,
    private readonly instruments: RecallInstrumentsReader,
    private readonly organizations: OrganizationsReader,
  ) {}

  onApplicationBootstrap(): void {
    // Off when KC_RECALL_DISABLED is on (the test app sets it; tests call run()).
    if (this.config.recall.disabled) return;
    const delay = this.config.recall.delayMs;
    const tick = () => {
      this.run(null).catch((error: unknown) => this.logger.error(`recall reminder failed: ${error instanceof Error ? error.message : String(error)}`));
    };
    const first = setTimeout(() => {
      tick();
      const daily = setInterval(tick, DAY_MS);
      daily.unref();
      this.timers.push(daily);
    }, delay);
    first.unref();
    this.timers.push(first);
  }

  onApplicationShutdown(): void {
    for (const timer of this.timers) clearTimeout(timer);
    this.timers = [];
  }

  /** One pass; concurrent callers share it. */
  run(actorId: number | null, now?: Date): Promise<RecallRunResult> {
    if (!this.running) {
      this.running = runRecall(this.dataSource, (mail) => this.mail.mailer.send(mail), { publicUrl: this.config.publicUrl, now })
        .then(async (result) => {
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
