import { Column, Entity, JoinColumn, ManyToOne, OneToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Job } from '../jobs/job.entity.js';
import { Procedure } from './procedure.entity.js';

/** The procedure a job is calibrated to (jobs without a row use the default procedure). */
@Entity('job_procedures')
export class JobProcedure {
  @PrimaryColumn({ name: 'job_id', type: 'int' })
  jobId: number;

  @OneToOne(() => Job, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'job_id', foreignKeyConstraintName: 'FK_job_procedures_job' })
  job: Relation<Job>;

  @Column({ name: 'procedure_id', type: 'int' })
  procedureId: number;

  @ManyToOne(() => Procedure, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'procedure_id', foreignKeyConstraintName: 'FK_job_procedures_procedure' })
  procedure: Relation<Procedure>;
}
