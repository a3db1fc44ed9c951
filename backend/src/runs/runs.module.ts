import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { JobsModule } from '../jobs/jobs.module.js';
import { BridgePresenceModule } from '../shared/bridge-presence.module.js';
import { Run } from './run.entity.js';
import { JobRunsController, RunsController } from './runs.controller.js';
import { RunsService } from './runs.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Run]), JobsModule, BridgePresenceModule],
  controllers: [RunsController, JobRunsController],
  providers: [RunsService],
  exports: [RunsService],
})
export class RunsModule {}
