import { Module } from '@nestjs/common';
import { CertificatesModule } from '../certificates/certificates.module.js';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { ExportsController } from './exports.controller.js';
import { ExportsService } from './exports.service.js';

/** CSV downloads of a run's readings and a job's results. */
@Module({
  imports: [JobsModule, RunsModule, InstrumentsModule, CertificatesModule],
  controllers: [ExportsController],
  providers: [ExportsService],
})
export class ExportsModule {}
