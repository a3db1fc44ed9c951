import { Module } from '@nestjs/common';
import { ExportsController } from './exports.controller.js';
import { ExportsService } from './exports.service.js';

/** CSV downloads of a run's readings and a job's results. */
@Module({
  controllers: [ExportsController],
  providers: [ExportsService],
})
export class ExportsModule {}
