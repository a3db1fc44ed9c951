import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { IngestModule } from '../ingest/ingest.module.js';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { CaptureSettingsSource } from '../shared/capture-settings.js';
import { ReadingsModule } from '../readings/readings.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { StandardsModule } from '../standards/standards.module.js';
import { BudgetsController } from './budgets.controller.js';
import { BudgetsService } from './budgets.service.js';
import { JobProcedure } from './job-procedure.entity.js';
import { JobResultsReader } from './job-results.reader.js';
import { JobResultsService } from './job-results.service.js';
import { ProcedureCaptureReader } from './procedure-capture.reader.js';
import { ProcedureVersionRow } from './procedure-version.entity.js';
import { Procedure } from './procedure.entity.js';
import { RunBudget } from './run-budget.entity.js';

/**
 * Global: ingest (which this module imports for a job's results) reads a procedure's capture settings through
 * the CaptureSettingsSource token declared in shared/, which this module provides; the dependency stays one way.
 */
@Global()
@Module({
  imports: [
    TypeOrmModule.forFeature([Procedure, ProcedureVersionRow, JobProcedure, RunBudget]),
    // Owners of the tables a job's results read (JobResultsReader reads them through their readers).
    JobsModule,
    RunsModule,
    StandardsModule,
    InstrumentsModule,
    ReadingsModule,
    IngestModule,
  ],
  controllers: [BudgetsController],
  providers: [
    BudgetsService,
    JobResultsReader,
    JobResultsService,
    ProcedureCaptureReader,
    { provide: CaptureSettingsSource, useExisting: ProcedureCaptureReader },
  ],
  exports: [BudgetsService, JobResultsService, ProcedureCaptureReader, CaptureSettingsSource],
})
export class BudgetsModule {}
