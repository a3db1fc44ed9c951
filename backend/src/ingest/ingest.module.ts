import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BenchesModule } from '../benches/benches.module.js';
import { ReadingsModule } from '../readings/readings.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { BridgePresenceModule } from '../shared/bridge-presence.module.js';
import { CapturesController } from './captures.controller.js';
import { CounterCaptureRow, CounterCaptureSample } from './counter-capture.entity.js';
import { CounterCaptureService } from './counter-capture.service.js';
import { IngestGateway } from './ingest.gateway.js';
import { IngestService } from './ingest.service.js';
import { CaptureResultsReader } from './capture-results.reader.js';

/**
 * The bench side: the `/ingest` gateway, which runs a bridge feeds (BridgePresence, one interface so the
 * state can move out of this process later) and counter-assisted capture, which the bridge's readings drive.
 * Readings are stored through ReadingsModule's ReadingsWriter.
 */
@Module({
  imports: [BenchesModule, ReadingsModule, RunsModule, BridgePresenceModule, TypeOrmModule.forFeature([CounterCaptureRow, CounterCaptureSample])],
  controllers: [CapturesController],
  providers: [IngestService, IngestGateway, CounterCaptureService, CaptureResultsReader],
  exports: [CounterCaptureService, CaptureResultsReader],
})
export class IngestModule {}
