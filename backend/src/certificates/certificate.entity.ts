import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { CertificateStatus, Decision, JobResults, SignedRecord } from '@kilocycle/common/types';
import { Instrument } from '../instruments/instrument.entity.js';
import { Job } from '../jobs/job.entity.js';
import { Organization } from '../organizations/organization.entity.js';
import { User } from '../users/user.entity.js';

/** One revision of a calibration certificate. The PDF is made once, at signing, and never rebuilt. */
@Entity('certificates')
@Index('UQ_certificates_number_revision', ['number', 'revision'], { unique: true })
@Index('IDX_certificates_organization_status', ['organizationId', 'status'])
export class Certificate {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 32 })
  number: string;

  @Column({ type: 'int' })
  revision: number;

  @Column({ type: 'varchar', length: 16 })
  status: CertificateStatus;

  @Index('IDX_certificates_job')
  @Column({ name: 'job_id', type: 'int' })
  jobId: number;

  @ManyToOne(() => Job, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'job_id', foreignKeyConstraintName: 'FK_certificates_job' })
  job: Relation<Job>;

  /** The customer, copied from the job for scoping. */
  @Column({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_certificates_organization' })
  organization: Relation<Organization>;

  @Column({ name: 'instrument_id', type: 'int' })
  instrumentId: number;

  @ManyToOne(() => Instrument, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'instrument_id', foreignKeyConstraintName: 'FK_certificates_instrument' })
  instrument: Relation<Instrument>;

  @Column({ name: 'signed_by', type: 'int', nullable: true })
  signedById: number | null;

  @ManyToOne(() => User, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'signed_by', foreignKeyConstraintName: 'FK_certificates_signed_by' })
  signedBy: Relation<User> | null;

  @Column({ name: 'signed_at', type: 'datetime', precision: 3, nullable: true })
  signedAt: Date | null;

  @Column({ name: 'signing_meaning', type: 'varchar', length: 200, nullable: true })
  signingMeaning: string | null;

  @Column({ name: 'issued_at', type: 'datetime', precision: 3, nullable: true })
  issuedAt: Date | null;

  /**
   * The PDF in the file store (storage module, `stored_files`), which every app node reads; served only by the
   * certificate's id after the scope check. NULL on a draft, and on a revision whose file was already missing
   * when files moved from var/certificates into the database.
   */
  @Index('UQ_certificates_pdf_file', { unique: true })
  @Column({ name: 'pdf_file_id', type: 'int', nullable: true })
  pdfFileId: number | null;

  @Column({ type: 'char', length: 64, nullable: true })
  sha256: string | null;

  /** Ed25519 signature (base64) of `signedPayload(number, revision, sha256)`. */
  @Column({ type: 'varchar', length: 120, nullable: true })
  signature: string | null;

  @Column({ name: 'key_id', type: 'char', length: 16, nullable: true })
  keyId: string | null;

  @Column({ name: 'replaces_revision', type: 'int', nullable: true })
  replacesRevision: number | null;

  @Column({ name: 'amendment_reason', type: 'text', nullable: true })
  amendmentReason: string | null;

  @Column({ name: 'withdrawn_reason', type: 'text', nullable: true })
  withdrawnReason: string | null;

  @Column({ name: 'withdrawn_at', type: 'datetime', precision: 3, nullable: true })
  withdrawnAt: Date | null;

  @Column({ name: 'superseded_at', type: 'datetime', precision: 3, nullable: true })
  supersededAt: Date | null;

  @Column({ type: 'varchar', length: 20, nullable: true })
  decision: Decision | null;

  /** The as-found outcome (worst as-found decision), set at signing: an as-found failure shows in lists. */
  @Column({ name: 'as_found_decision', type: 'varchar', length: 20, nullable: true })
  asFoundDecision: Decision | null;

  /** The results exactly as printed, stored at signing. */
  @Column({ type: 'json', nullable: true })
  results: JobResults | null;

  /** Everything the signature covers, captured at signing (null only for revisions signed before it was kept). */
  @Column({ type: 'json', nullable: true })
  record: SignedRecord | null;

  /** The instrument and the customer as printed on this revision, for lists and the public page. */
  @Column({ name: 'instrument_label', type: 'varchar', length: 400, nullable: true })
  instrumentLabel: string | null;

  @Column({ name: 'customer_name', type: 'varchar', length: 200, nullable: true })
  customerName: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;
}
