import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { OrganizationsModule } from '../organizations/organizations.module.js';
import { InstrumentRange } from './instrument-range.entity.js';
import { Instrument } from './instrument.entity.js';
import { InstrumentsController } from './instruments.controller.js';
import { InstrumentsService } from './instruments.service.js';
import { BillingInstrumentsReader } from './billing-instruments.reader.js';
import { CertificateInstrumentWriter } from './certificate-instrument.writer.js';
import { InstrumentComparisonReader } from './instrument-comparison.reader.js';
import { JobInstrumentReader } from './job-instrument.reader.js';
import { RangeResultsReader } from './range-results.reader.js';
import { RecallInstrumentsReader } from './recall-instruments.reader.js';
import { ReviewInstrumentsReader } from './review-instruments.reader.js';

@Module({
  imports: [TypeOrmModule.forFeature([Instrument, InstrumentRange]), OrganizationsModule],
  controllers: [InstrumentsController],
  providers: [
    InstrumentsService,
    RangeResultsReader,
    InstrumentComparisonReader,
    RecallInstrumentsReader,
    JobInstrumentReader,
    ReviewInstrumentsReader,
    CertificateInstrumentWriter,
    BillingInstrumentsReader,
  ],
  exports: [
    InstrumentsService,
    RangeResultsReader,
    InstrumentComparisonReader,
    RecallInstrumentsReader,
    JobInstrumentReader,
    ReviewInstrumentsReader,
    CertificateInstrumentWriter,
    BillingInstrumentsReader,
  ],
})
export class InstrumentsModule {}
