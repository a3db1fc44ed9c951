import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RunsModule } from '../runs/runs.module.js';
import { NewestReadingSource } from '../shared/newest-reading.js';
import { ReadingExclusion } from './reading-exclusion.entity.js';
import { Reading } from './reading.entity.js';
import { ReadingResultsReader } from './reading-results.reader.js';
import { ReadingsController } from './readings.controller.js';
import { ReadingsWriter } from './readings-writer.service.js';
import { ReadingsService } from './readings.service.js';
import { RunReadingsReader } from './run-readings.reader.js';

/**
 * Readings typed at the bench, listed and excluded, and the one write path (ReadingsWriter) that the
 * bench page, CSV import and the bridge share: ingest, imports and live import this module to get the
 * same instance, so the live gateway pushes what any path stores. The readers answer what other modules
 * ask about a run's readings.
 *
 * Global for one reason: runs (which this module imports for a run's write context) reads a run's newest reading
 * through the NewestReadingSource token declared in shared/, which this module provides; without
 * importing readings, runs can only see it if the token is global. The dependency stays one way.
 */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([Reading, ReadingExclusion]), RunsModule],
  controllers: [ReadingsController],
  providers: [ReadingsService, ReadingsWriter, ReadingResultsReader, RunReadingsReader, { provide: NewestReadingSource, useExisting: RunReadingsReader }],
  exports: [ReadingsWriter, ReadingResultsReader, RunReadingsReader, NewestReadingSource],
})
export class ReadingsModule {}
