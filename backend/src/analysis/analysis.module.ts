import { Module } from '@nestjs/common';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { AnalysisController } from './analysis.controller.js';
import { AnalysisService } from './analysis.service.js';
import { BandPlanService } from './band-plan.service.js';
import { RunSeriesLoader } from './run-series.loader.js';

@Module({
  imports: [InstrumentsModule, RunsModule],
  controllers: [AnalysisController],
  providers: [AnalysisService, BandPlanService, RunSeriesLoader],
  exports: [AnalysisService],
})
export class AnalysisModule {}
