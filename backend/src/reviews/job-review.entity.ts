import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ReviewAction } from '@kilocycle/common/types';
import { Job } from '../jobs/job.entity.js';

/** The review history of a job: submitted, returned with a comment, signed, refused, amended, withdrawn. */
@Entity('job_reviews')
@Index('IDX_job_reviews_job', ['jobId', 'id'])
export class JobReview {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'job_id', type: 'int' })
  jobId: number;

  @ManyToOne(() => Job, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'job_id', foreignKeyConstraintName: 'FK_job_reviews_job' })
  job: Relation<Job>;

  @Column({ type: 'varchar', length: 16 })
  action: ReviewAction;

  @Column({ name: 'actor_id', type: 'int', nullable: true })
  actorId: number | null;

  @Column({ type: 'text', nullable: true })
  comment: string | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  at: Date;
}
