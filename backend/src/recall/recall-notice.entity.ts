import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Instrument } from '../instruments/instrument.entity.js';

/** A recall reminder sent: at most one per instrument and due date. */
@Entity('recall_notices')
@Index('UQ_recall_notices_instrument_due', ['instrumentId', 'dueDate'], { unique: true })
export class RecallNotice {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'instrument_id', type: 'int' })
  instrumentId: number;

  @ManyToOne(() => Instrument, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'instrument_id', foreignKeyConstraintName: 'FK_recall_notices_instrument' })
  instrument: Relation<Instrument>;

  @Column({ name: 'due_date', type: 'date' })
  dueDate: string;

  @Column({ type: 'json' })
  recipients: string[];

  @Column({ name: 'sent_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  sentAt: Date;
}
