import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Job } from './job.entity.js';
import { JobComparisonReader } from './job-comparison.reader.js';
import { JobResultsJobReader } from './job-results.reader.js';
import { JobScopeReader } from './job-scope.reader.js';
import { JobsController } from './jobs.controller.js';
import { JobsService } from './jobs.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Job])],
  controllers: [JobsController],
  providers: [JobsService, JobResultsJobReader, JobComparisonReader, JobScopeReader],
  exports: [JobsService, JobResultsJobReader, JobComparisonReader, JobScopeReader],
})
export class JobsModule {}
