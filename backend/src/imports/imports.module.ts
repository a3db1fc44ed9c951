import { Module } from '@nestjs/common';
import { IngestModule } from '../ingest/ingest.module.js';
import { ImportProgressStore } from './import-progress.store.js';
import { ImportsController } from './imports.controller.js';
import { ImportsService } from './imports.service.js';

/** CSV/TSV import of readings into a run, through the one ReadingsWriter (which IngestModule provides). */
@Module({
  imports: [IngestModule],
  controllers: [ImportsController],
  providers: [ImportsService, ImportProgressStore],
})
export class ImportsModule {}
