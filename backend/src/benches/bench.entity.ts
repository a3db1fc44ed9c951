import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Standard } from '../standards/standard.entity.js';

/** A measurement station; its bridge authenticates with a token stored here only as a hash. */
@Entity('benches')
export class Bench {
  @PrimaryGeneratedColumn()
  id: number;

  @Index('UQ_benches_name', { unique: true })
  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'varchar', length: 200, nullable: true })
  location: string | null;

  @Column({ name: 'default_standard_id', type: 'int', nullable: true })
  defaultStandardId: number | null;

  @ManyToOne(() => Standard, { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'default_standard_id', foreignKeyConstraintName: 'FK_benches_default_standard' })
  defaultStandard: Relation<Standard> | null;

  /** SHA-256 of the bench token (tokens are long random strings, so a plain hash is enough). */
  @Index('UQ_benches_token_hash', { unique: true })
  @Column({ name: 'token_hash', type: 'char', length: 64, nullable: true })
  tokenHash: string | null;

  @Column({ name: 'token_issued_at', type: 'datetime', nullable: true })
  tokenIssuedAt: Date | null;

  @Column({ type: 'boolean', default: true })
  active: boolean;
}
