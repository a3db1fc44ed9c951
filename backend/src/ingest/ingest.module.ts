import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BenchesModule } from '../benches/benches.module.js';
import { ReadingsWriter } from '../readings/readings-writer.service.js';
import { BridgePresence, MemoryBridgePresence } from './bridge-presence.js';
import { CapturesController } from './captures.controller.js';
import { CounterCaptureRow, CounterCaptureSample } from './counter-capture.entity.js';
import { CounterCaptureService } from './counter-capture.service.js';
import { IngestGateway } from './ingest.gateway.js';
import { IngestService } from './ingest.service.js';

/**
 * The bench side: the `/ingest` gateway, which runs a bridge feeds (BridgePresence, one interface so the
 * state can move out of this process later) and counter-assisted capture, which the bridge's readings drive.
 */
@Module({
  imports: [BenchesModule, TypeOrmModule.forFeature([CounterCaptureRow, CounterCaptureSample])],
  controllers: [CapturesController],
  providers: [ReadingsWriter, IngestService, IngestGateway, { provide: BridgePresence, useClass: MemoryBridgePresence }, CounterCaptureService],
  exports: [ReadingsWriter, BridgePresence, CounterCaptureService],
})
export class IngestModule {}
