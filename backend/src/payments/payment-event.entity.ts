import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';

/**
 * Every payment-service event applied, by its id: a replayed event finds its row and changes nothing. Written in
 * the same transaction as the change it made.
 */
@Entity('payment_events')
export class PaymentEvent {
  /** The service's event id (evt_…). */
  @PrimaryColumn({ name: 'event_id', type: 'varchar', length: 255 })
  eventId: string;

  @Column({ type: 'varchar', length: 100 })
  type: string;

  @Column({ name: 'payment_id', type: 'int', nullable: true })
  paymentId: number | null;

  /** What the event did: applied, or why it was set aside (an event for a payment we do not know, say). */
  @Column({ type: 'varchar', length: 500 })
  outcome: string;

  @CreateDateColumn({ name: 'received_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  receivedAt: Date;
}
