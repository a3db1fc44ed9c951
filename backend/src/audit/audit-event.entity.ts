import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity('audit_events')
@Index('IDX_audit_events_entity', ['entity', 'entityId'])
export class AuditEvent {
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id: string;

  /** Null for actions the system takes by itself (the scheduled recall, the seed). */
  @Column({ name: 'actor_id', type: 'int', nullable: true })
  actorId: number | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  at: Date;

  @Column({ type: 'varchar', length: 40 })
  entity: string;

  @Column({ name: 'entity_id', type: 'varchar', length: 40 })
  entityId: string;

  @Column({ type: 'varchar', length: 40 })
  action: string;

  @Column({ type: 'json', nullable: true })
  changes: Record<string, unknown> | null;
}
