import { Column, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm';

/** Admin settings as key/value pairs (allowSelfSign, certificatePrefix, labAddress …). */
@Entity('settings')
export class Setting {
  @PrimaryColumn({ type: 'varchar', length: 64 })
  key: string;

  @Column({ type: 'json' })
  value: unknown;

  @Column({ name: 'updated_by', type: 'int', nullable: true })
  updatedById: number | null;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
