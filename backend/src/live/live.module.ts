import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module.js';
import { ImportsModule } from '../imports/imports.module.js';
import { IngestModule } from '../ingest/ingest.module.js';
import { ReadingsModule } from '../readings/readings.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { BridgePresenceModule } from '../shared/bridge-presence.module.js';
import { LiveGateway } from './live.gateway.js';
import { LiveService } from './live.service.js';

@Module({
  imports: [AuthModule, ImportsModule, IngestModule, ReadingsModule, RunsModule, BridgePresenceModule],
  providers: [LiveService, LiveGateway],
})
export class LiveModule {}
