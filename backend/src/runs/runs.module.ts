import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { IngestModule } from '../ingest/ingest.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { Run } from './run.entity.js';
import { JobRunsController, RunsController } from './runs.controller.js';
import { RunsService } from './runs.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Run]), JobsModule, IngestModule],
  controllers: [RunsController, JobRunsController],
  providers: [RunsService],
  exports: [RunsService],
})
export class RunsModule {}
