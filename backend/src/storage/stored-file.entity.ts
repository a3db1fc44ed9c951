import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';

/** What a stored file is, for the reader who finds a row and for the store's own check on read. */
export type StoredFileKind = 'certificate-pdf' | 'attachment' | 'quote-pdf' | 'invoice-pdf' | 'credit-note-pdf';

/**
 * Files every app node reads: certificate PDFs and attachments, kept in MariaDB instead of a node's var/.
 * A file is one head row (its id is the file's id; `file_id` NULL, part 0) holding the first part of the
 * bytes and the file's kind, size, part count and SHA-256, then one row per further part (`file_id` = the
 * head's id, part 1, 2, …). Parts are at most 1 MiB, so no statement, dump line or restore comes near
 * MariaDB's max_allowed_packet (16 MiB by default, 4 MiB on older servers) whatever the attachment limit.
 */
@Entity('stored_files')
@Index('UQ_stored_files_part', ['fileId', 'part'], { unique: true })
export class StoredFile {
  @PrimaryGeneratedColumn()
  id: number;

  /** The head row's id on a further part; NULL on the head. Deleting the head deletes its parts. */
  @Column({ name: 'file_id', type: 'int', nullable: true })
  fileId: number | null;

  @ManyToOne(() => StoredFile, { onDelete: 'CASCADE', nullable: true })
  @JoinColumn({ name: 'file_id', foreignKeyConstraintName: 'FK_stored_files_file' })
  file: Relation<StoredFile> | null;

  @Column({ type: 'int', default: 0 })
  part: number;

  @Column({ type: 'varchar', length: 32 })
  kind: StoredFileKind;

  /** Of the whole file, on the head row only. */
  @Column({ type: 'char', length: 64, nullable: true })
  sha256: string | null;

  /** Of the whole file, on the head row only. */
  @Column({ name: 'size_bytes', type: 'int', nullable: true })
  sizeBytes: number | null;

  /** On the head row only: how many rows hold the bytes (the head included). */
  @Column({ name: 'part_count', type: 'int', nullable: true })
  partCount: number | null;

  @Column({ type: 'mediumblob' })
  content: Buffer;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;
}
