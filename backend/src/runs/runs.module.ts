import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { JobsModule } from '../jobs/jobs.module.js';
import { BridgePresenceModule } from '../shared/bridge-presence.module.js';
import { RunContextReader } from './run-context.reader.js';
import { RunNotesWriter } from './run-notes.writer.js';
import { Run } from './run.entity.js';
import { RunComparisonReader } from './run-comparison.reader.js';
import { RunResultsReader } from './run-results.reader.js';
import { JobRunsController, RunsController } from './runs.controller.js';
import { RunsService } from './runs.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Run]), JobsModule, BridgePresenceModule],
  controllers: [RunsController, JobRunsController],
  providers: [RunsService, RunResultsReader, RunComparisonReader, RunContextReader, RunNotesWriter],
  exports: [RunsService, RunResultsReader, RunComparisonReader, RunContextReader, RunNotesWriter],
})
export class RunsModule {}
