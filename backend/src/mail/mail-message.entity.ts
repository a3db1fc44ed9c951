import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A message as the local mail fake received it over SMTP: envelope, a few parsed headers, the raw text. */
@Entity('mail_messages')
@Index('IDX_mail_messages_received', ['receivedAt'])
export class MailMessage {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'message_id', type: 'varchar', length: 255, nullable: true })
  messageId: string | null;

  @Column({ type: 'varchar', length: 32 })
  kind: string;

  @Column({ name: 'mail_from', type: 'varchar', length: 254 })
  mailFrom: string;

  @Column({ name: 'rcpt_to', type: 'json' })
  rcptTo: string[];

  @Column({ type: 'varchar', length: 500 })
  subject: string;

  @Column({ type: 'int' })
  size: number;

  @Column({ name: 'attachment_count', type: 'int', default: 0 })
  attachmentCount: number;

  @Column({ type: 'longtext' })
  raw: string;

  @Column({ name: 'received_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  receivedAt: Date;
}
