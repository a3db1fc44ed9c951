import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { AttachmentContentType } from '@kilocycle/common/types';
import { Instrument } from '../instruments/instrument.entity.js';
import { Job } from '../jobs/job.entity.js';
import { User } from '../users/user.entity.js';

/**
 * A photo or document on an instrument or a job (exactly one of the two). The bytes live in the file store
 * (storage module, `stored_files`), which every app node reads; they are served only by id, after the scope check.
 */
@Entity('attachments')
@Index('IDX_attachments_instrument', ['instrumentId'])
@Index('IDX_attachments_job', ['jobId'])
@Index('UQ_attachments_file', ['fileId'], { unique: true })
export class Attachment {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'instrument_id', type: 'int', nullable: true })
  instrumentId: number | null;

  @ManyToOne(() => Instrument, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'instrument_id', foreignKeyConstraintName: 'FK_attachments_instrument' })
  instrument: Relation<Instrument> | null;

  @Column({ name: 'job_id', type: 'int', nullable: true })
  jobId: number | null;

  @ManyToOne(() => Job, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'job_id', foreignKeyConstraintName: 'FK_attachments_job' })
  job: Relation<Job> | null;

  /** The bytes in the file store; NULL only when the file was already missing as files moved from var/ into the database. */
  @Column({ name: 'file_id', type: 'int', nullable: true })
  fileId: number | null;

  @Column({ name: 'original_name', type: 'varchar', length: 255 })
  originalName: string;

  @Column({ type: 'varchar', length: 500, nullable: true })
  caption: string | null;

  /** Found from the bytes when uploaded. */
  @Column({ name: 'content_type', type: 'varchar', length: 64 })
  contentType: AttachmentContentType;

  @Column({ name: 'size_bytes', type: 'int' })
  sizeBytes: number;

  @Column({ type: 'char', length: 64 })
  sha256: string;

  @Column({ name: 'uploaded_by', type: 'int' })
  uploadedById: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'uploaded_by', foreignKeyConstraintName: 'FK_attachments_uploaded_by' })
  uploadedBy: Relation<User>;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;
}
