import { Injectable, Logger, type OnApplicationShutdown, type OnModuleInit } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { Mailer, type OutgoingMail } from './mailer.js';
import { certificateIssuedMail, jobReturnedMail, quoteSentMail } from './mail-templates.js';

// What other modules may use of mail besides the service: the mailer (the CLI's recall run builds one) and the templates.
export { Mailer, type OutgoingMail } from './mailer.js';
export { recallReminderMail } from './mail-templates.js';
export { creditNoteMail, invoiceIssuedMail, invoiceOverdueMail } from './invoice-mail-templates.js';

/** The app's mail: starts the fake with the app (unless real SMTP is configured) and never fails a caller. */
@Injectable()
export class MailService implements OnModuleInit, OnApplicationShutdown {
  private readonly logger = new Logger('Mail');
  readonly mailer: Mailer;

  constructor(
    @InjectDataSource() dataSource: DataSource,
    private readonly audit: AuditService,
  ) {
    this.mailer = new Mailer(dataSource, undefined, (m) => this.logger.warn(m));
  }

  async onModuleInit(): Promise<void> {
    await this.mailer.start();
  }

  async onApplicationShutdown(): Promise<void> {
    await this.mailer.stop();
  }

  /** Tells the job's technician that the lead returned it for rework (never fails the caller: see sendSafely). */
  sendJobReturned(content: Parameters<typeof jobReturnedMail>[0], about: { entity: string; entityId: string | number }): Promise<boolean> {
    return this.sendSafely(jobReturnedMail(content), about);
  }

  /** Sends the customer an issued certificate with its PDF (never fails the caller: see sendSafely). */
  sendCertificateIssued(content: Parameters<typeof certificateIssuedMail>[0], about: { entity: string; entityId: string | number }): Promise<boolean> {
    return this.sendSafely(certificateIssuedMail(content), about);
  }

  /** Sends the customer a quote with its PDF (never fails the caller: see sendSafely). */
  sendQuoteSent(content: Parameters<typeof quoteSentMail>[0], about: { entity: string; entityId: string | number }): Promise<boolean> {
    return this.sendSafely(quoteSentMail(content), about);
  }

  /**
   * Sends and reports whether it went. A failure is logged and audited but never undoes the action that
   * caused the mail (a signed certificate stays signed when the mail server is down).
   */
  async sendSafely(mail: OutgoingMail, about: { entity: string; entityId: string | number }): Promise<boolean> {
    try {
      await this.mailer.send(mail);
      return true;
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      this.logger.error(`could not send "${mail.subject}" to ${mail.to.join(', ')}: ${reason}`);
      await this.audit
        .record({ actorId: null, entity: about.entity, entityId: about.entityId, action: 'mail_failed', changes: { kind: mail.kind, to: mail.to, reason } })
        .catch(() => undefined);
      return false;
    }
  }
}
