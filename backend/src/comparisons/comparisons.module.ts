import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RunSeriesLoader } from '../analysis/run-series.loader.js';
import { ComparisonEngine } from './comparison-engine.service.js';
import { Comparison } from './comparison.entity.js';
import { ComparisonsController } from './comparisons.controller.js';
import { ComparisonsService } from './comparisons.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Comparison])],
  controllers: [ComparisonsController],
  providers: [ComparisonsService, ComparisonEngine, RunSeriesLoader],
})
export class ComparisonsModule {}
