import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BenchesModule } from '../benches/benches.module.js';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { StandardsModule } from '../standards/standards.module.js';
import { BridgePresenceModule } from '../shared/bridge-presence.module.js';
import { JobRunStatsSource } from '../shared/job-run-stats.js';
import { RangeUseSource } from '../shared/range-use.js';
import { BillingRunsReader } from './billing-runs.reader.js';
import { JobRunsReader } from './job-runs.reader.js';
import { RangeUseReader } from './range-use.reader.js';
import { RunContextReader } from './run-context.reader.js';
import { RunCountersWriter } from './run-counters.writer.js';
import { RunNotesWriter } from './run-notes.writer.js';
import { RunStandardVersionWriter } from './run-standard-version.writer.js';
import { Run } from './run.entity.js';
import { RunComparisonReader } from './run-comparison.reader.js';
import { RunResultsReader } from './run-results.reader.js';
import { JobRunsController, RunsController } from './runs.controller.js';
import { RunsService } from './runs.service.js';

/**
 * Global: jobs (which this module imports) reads run counts through the JobRunStatsSource
 * token declared in shared/, which this module provides; the dependency stays one way, runs → jobs.
 * Instruments asks which ranges have runs through RangeUseSource the same way (runs → instruments).
 */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([Run]), JobsModule, InstrumentsModule, BenchesModule, StandardsModule, BridgePresenceModule],
  controllers: [RunsController, JobRunsController],
  providers: [
    RunsService,
    RunResultsReader,
    RunComparisonReader,
    RunContextReader,
    RunCountersWriter,
    RunNotesWriter,
    RunStandardVersionWriter,
    JobRunsReader,
    { provide: JobRunStatsSource, useExisting: JobRunsReader },
    RangeUseReader,
    { provide: RangeUseSource, useExisting: RangeUseReader },
    BillingRunsReader,
  ],
  exports: [
    RunsService,
    RunResultsReader,
    RunComparisonReader,
    RunContextReader,
    RunCountersWriter,
    RunNotesWriter,
    RunStandardVersionWriter,
    JobRunStatsSource,
    RangeUseSource,
    BillingRunsReader,
  ],
})
export class RunsModule {}
