import nodemailer, { type Transporter } from 'nodemailer';
import type { DataSource } from 'typeorm';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { checkEnvironment, ConfigError } from '../config/config.module.js';
import { MailMessage } from './mail-message.entity.js';
import { mailSignOff, mailTextToHtml } from './mail-text.js';
import { parseMessage } from './read-message.js';
import { SmtpFake, type CapturedMail } from './smtp-fake.js';

export type MailKind =
  'certificate_issued' | 'job_returned' | 'recall_reminder' | 'quote_sent' | 'invoice_issued' | 'credit_note' | 'invoice_overdue' | 'other';

export type OutgoingMail = {
  kind: MailKind;
  to: string[];
  subject: string;
  text: string;
  html?: string;
  /** The URLs the template wrote itself: the only text that becomes a link in the HTML part. */
  links?: string[];
  attachments?: Array<{ filename: string; content: Buffer; contentType: string }>;
};

export type MailSettings = {
  /** Real SMTP server; null starts the local fake. */
  host: string | null;
  port: number;
  secure: boolean;
  user: string | null;
  password: string | null;
  from: string;
};

/** KC_SMTP_HOST/PORT/USER/PASSWORD/FROM/SECURE; without KC_SMTP_HOST the fake on 127.0.0.1:KC_SMTP_PORT (default 2526). */
export function mailSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): MailSettings {
  // Read through the one settings schema: KC_SMTP_SECURE=1/yes/on count as on, a bad port is refused there.
  const { values: v, problems } = checkEnvironment(env);
  const bad = problems.filter((p) => p.key.startsWith('KC_SMTP_'));
  if (bad.length > 0) throw new ConfigError(bad);
  const host = v.KC_SMTP_HOST?.trim() || null;
  const port = v.KC_SMTP_PORT ?? (host ? 587 : env.NODE_ENV === 'test' ? 0 : 2526);
  return {
    host,
    port,
    secure: v.KC_SMTP_SECURE ?? (host !== null && port === 465),
    user: v.KC_SMTP_USER || null,
    password: v.KC_SMTP_PASSWORD || null,
    from: v.KC_SMTP_FROM || 'Kilocycle <no-reply@kilocycle.local>',
  };
}

/** Stores one captured message in mail_messages (the admin outbox). */
export async function storeCapturedMail(dataSource: DataSource, mail: CapturedMail): Promise<void> {
  const parsed = await parseMessage(mail.raw);
  await dataSource.getRepository(MailMessage).insert({
    messageId: parsed.messageId?.slice(0, 255) ?? null,
    kind: parsed.kind.slice(0, 32),
    mailFrom: mail.from.slice(0, 254),
    rcptTo: mail.to,
    subject: parsed.subject.slice(0, 500),
    size: Buffer.byteLength(mail.raw),
    attachmentCount: parsed.attachments.length,
    raw: mail.raw,
  });
}

/**
 * Sends mail with nodemailer over SMTP: to the configured server, or to the in-process fake, which
 * captures every message into the database. Used by the Nest MailService and by the CLI alike.
 */
export class Mailer {
  private fake: SmtpFake | null = null;
  private transport: Transporter | null = null;
  port = 0;

  constructor(
    private readonly dataSource: DataSource,
    readonly settings: MailSettings = mailSettingsFromEnv(),
    private readonly warn: (message: string) => void = (m) => console.warn(m),
  ) {}

  get usesFake(): boolean {
    return this.settings.host === null;
  }

  async start(): Promise<void> {
    if (this.transport) return;
    if (this.settings.host === null) {
      this.fake = new SmtpFake((mail) => storeCapturedMail(this.dataSource, mail));
      this.port = await this.fake.start(this.settings.port, (wanted, got) =>
        this.warn(`Mail fake: port ${wanted} is in use, listening on 127.0.0.1:${got} instead`),
      );
      this.transport = nodemailer.createTransport({ host: '127.0.0.1', port: this.port, secure: false, ignoreTLS: true });
    } else {
      this.port = this.settings.port;
      this.transport = nodemailer.createTransport({
        host: this.settings.host,
        port: this.settings.port,
        secure: this.settings.secure,
        auth: this.settings.user ? { user: this.settings.user, pass: this.settings.password ?? '' } : undefined,
      });
    }
  }

  /** The lab's name and contact address (its organisation record): where replies to any mail should go. */
  async labContact(): Promise<{ name: string; email: string | null }> {
    const lab = await new OrganizationsReader(this.dataSource).lab();
    return { name: lab?.name ?? 'the laboratory', email: lab?.contactEmail || null };
  }

  /**
   * Sends one mail: the sign-off says truthfully where a reply goes (Reply-To is the lab's contact address when
   * it has one), and an HTML part is made from the text (escaped; only the template's own links are links).
   */
  async send(mail: OutgoingMail): Promise<string> {
    if (mail.to.length === 0) throw new Error('a mail needs at least one recipient');
    await this.start();
    const lab = await this.labContact();
    const fromAddress = /<([^>]+)>\s*$/.exec(this.settings.from)?.[1] ?? this.settings.from.trim();
    const text = mail.text + mailSignOff(lab, fromAddress);
    const info = await this.transport!.sendMail({
      from: this.settings.from,
      ...(lab.email ? { replyTo: { name: lab.name, address: lab.email } } : {}),
      to: mail.to,
      subject: mail.subject,
      text,
      html: mail.html ?? mailTextToHtml(text, mail.links),
      headers: { 'X-Kilocycle-Kind': mail.kind },
      attachments: mail.attachments,
    });
    return String(info.messageId ?? '');
  }

  async stop(): Promise<void> {
    this.transport?.close();
    this.transport = null;
    await this.fake?.stop();
    this.fake = null;
  }
}
