import { Module } from '@nestjs/common';
import { ReadingsModule } from '../readings/readings.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { ImportProgressStore } from './import-progress.store.js';
import { ImportsController } from './imports.controller.js';
import { ImportsService } from './imports.service.js';

/** CSV/TSV import of readings into a run, through the one ReadingsWriter (which ReadingsModule provides). */
@Module({
  imports: [ReadingsModule, RunsModule],
  controllers: [ImportsController],
  providers: [ImportsService, ImportProgressStore],
})
export class ImportsModule {}
