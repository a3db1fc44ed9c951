import { Module } from '@nestjs/common';
import { ScheduleModule } from '@nestjs/schedule';
import { TypeOrmModule } from '@nestjs/typeorm';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { OrganizationsModule } from '../organizations/organizations.module.js';
import { RecallNotice } from './recall-notice.entity.js';
import { RecallController } from './recall.controller.js';
import { RecallService } from './recall.service.js';

@Module({
  // The scheduler's registry (global once registered): recall is the only module with timed work.
  imports: [ScheduleModule.forRoot(), TypeOrmModule.forFeature([RecallNotice]), InstrumentsModule, OrganizationsModule],
  controllers: [RecallController],
  providers: [RecallService],
})
export class RecallModule {}
