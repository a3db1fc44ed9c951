import { Module } from '@nestjs/common';
import { ReadingsModule } from '../readings/readings.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { ImportProgressService } from './import-progress.service.js';
import { ImportsController } from './imports.controller.js';
import { ImportsService } from './imports.service.js';

/** CSV/TSV import of readings into a run, through the one ReadingsWriter (which ReadingsModule provides). */
@Module({
  imports: [ReadingsModule, RunsModule],
  controllers: [ImportsController],
  providers: [ImportsService, ImportProgressService],
  // The live gateway pushes each import's progress to its user's pages.
  exports: [ImportProgressService],
})
export class ImportsModule {}
