import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { Job } from './job.entity.js';
import { JobComparisonReader } from './job-comparison.reader.js';
import { JobResultsJobReader } from './job-results.reader.js';
import { JobScopeReader } from './job-scope.reader.js';
import { JobStatusWriter } from './job-status.writer.js';
import { JobsController } from './jobs.controller.js';
import { JobsService } from './jobs.service.js';
import { ReviewJobsReader } from './review-jobs.reader.js';

@Module({
  imports: [TypeOrmModule.forFeature([Job]), InstrumentsModule],
  controllers: [JobsController],
  providers: [JobsService, JobResultsJobReader, JobComparisonReader, JobScopeReader, ReviewJobsReader, JobStatusWriter],
  exports: [JobsService, JobResultsJobReader, JobComparisonReader, JobScopeReader, ReviewJobsReader, JobStatusWriter],
})
export class JobsModule {}
