import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { OrganizationsModule } from '../organizations/organizations.module.js';
import { CustomerTermsRow } from './customer-terms.entity.js';
import { CustomerTermsReader } from './customer-terms.reader.js';
import { PriceItem } from './price-item.entity.js';
import { PricesController } from './prices.controller.js';
import { PricesService } from './prices.service.js';
import { ProposedLinesReader } from './proposed-lines.reader.js';
import { TaxRate } from './tax-rate.entity.js';

/** The price list, tax rates and customer terms; owns price_items, tax_rates and customer_terms. (Runs' BillingRunsReader comes from the global RunsModule.) */
@Module({
  imports: [TypeOrmModule.forFeature([PriceItem, TaxRate, CustomerTermsRow]), OrganizationsModule, JobsModule, InstrumentsModule],
  controllers: [PricesController],
  providers: [PricesService, CustomerTermsReader, ProposedLinesReader],
  exports: [PricesService, CustomerTermsReader, ProposedLinesReader],
})
export class PricesModule {}
