import { Module } from '@nestjs/common';
import { BridgePresence, MemoryBridgePresence } from './bridge-presence.js';

/**
 * The one BridgePresence instance: ingest writes it (attach, disconnect), runs and live read it. It lives
 * here rather than in ingest so that runs can read it without importing the module that writes readings.
 */
@Module({
  providers: [{ provide: BridgePresence, useClass: MemoryBridgePresence }],
  exports: [BridgePresence],
})
export class BridgePresenceModule {}
