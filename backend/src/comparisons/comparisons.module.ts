import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AnalysisModule } from '../analysis/analysis.module.js';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { ComparisonEngine } from './comparison-engine.service.js';
import { Comparison } from './comparison.entity.js';
import { ComparisonsController } from './comparisons.controller.js';
import { ComparisonsService } from './comparisons.service.js';

@Module({
  // A run's series and analysis come from AnalysisModule; runs, jobs and instruments are read through their owners' readers.
  imports: [TypeOrmModule.forFeature([Comparison]), AnalysisModule, RunsModule, JobsModule, InstrumentsModule],
  controllers: [ComparisonsController],
  providers: [ComparisonsService, ComparisonEngine],
})
export class ComparisonsModule {}
