import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { IngestModule } from '../ingest/ingest.module.js';
import { ReadingExclusion } from './reading-exclusion.entity.js';
import { Reading } from './reading.entity.js';
import { ReadingsController } from './readings.controller.js';
import { ReadingsService } from './readings.service.js';

/**
 * Readings typed at the bench, listed and excluded. The write path itself (ReadingsWriter) comes from
 * IngestModule so that there is one instance: the live gateway pushes what either path stores.
 */
@Module({
  imports: [TypeOrmModule.forFeature([Reading, ReadingExclusion]), IngestModule],
  controllers: [ReadingsController],
  providers: [ReadingsService],
})
export class ReadingsModule {}
