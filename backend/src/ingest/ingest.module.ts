import { Module } from '@nestjs/common';
import { BenchesModule } from '../benches/benches.module.js';
import { ReadingsWriter } from '../readings/readings-writer.service.js';
import { IngestGateway } from './ingest.gateway.js';
import { IngestService } from './ingest.service.js';

@Module({
  imports: [BenchesModule],
  providers: [ReadingsWriter, IngestService, IngestGateway],
  exports: [ReadingsWriter],
})
export class IngestModule {}
