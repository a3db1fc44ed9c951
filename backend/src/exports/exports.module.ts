import { Module } from '@nestjs/common';
import { JobsModule } from '../jobs/jobs.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { ExportsController } from './exports.controller.js';
import { ExportsService } from './exports.service.js';

/** CSV downloads of a run's readings and a job's results. */
@Module({
  imports: [JobsModule, RunsModule],
  controllers: [ExportsController],
  providers: [ExportsService],
})
export class ExportsModule {}
