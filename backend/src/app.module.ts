import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AnalysisModule } from './analysis/analysis.module.js';
import { AttachmentsModule } from './attachments/attachments.module.js';
import { AuditModule } from './audit/audit.module.js';
import { AuthModule } from './auth/auth.module.js';
import { BenchesModule } from './benches/benches.module.js';
import { BudgetsModule } from './budgets/budgets.module.js';
import { CertificatesModule } from './certificates/certificates.module.js';
import { APP_CONFIG, type AppConfig } from './config/app-config.js';
import { ComparisonsModule } from './comparisons/comparisons.module.js';
import { ClusterModule } from './cluster/cluster.module.js';
import { ConfigModule } from './config/config.module.js';
import { typeormOptions } from './database/typeorm-options.js';
import { ExportsModule } from './exports/exports.module.js';
import { HealthModule } from './health/health.module.js';
import { ImportsModule } from './imports/imports.module.js';
import { IngestModule } from './ingest/ingest.module.js';
import { InvoicesModule } from './invoices/invoices.module.js';
import { PaymentsModule } from './payments/payments.module.js';
import { InstrumentsModule } from './instruments/instruments.module.js';
import { JobsModule } from './jobs/jobs.module.js';
import { LiveModule } from './live/live.module.js';
import { MailModule } from './mail/mail.module.js';
import { OrganizationsModule } from './organizations/organizations.module.js';
import { PricesModule } from './prices/prices.module.js';
import { QuotesModule } from './quotes/quotes.module.js';
import { ReadingsModule } from './readings/readings.module.js';
import { RecallModule } from './recall/recall.module.js';
import { ReviewsModule } from './reviews/reviews.module.js';
import { RunsModule } from './runs/runs.module.js';
import { StandardsModule } from './standards/standards.module.js';
import { UsersModule } from './users/users.module.js';

@Module({
  imports: [
    ConfigModule,
    ClusterModule,
    TypeOrmModule.forRootAsync({
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => ({ ...typeormOptions(config), autoLoadEntities: true, retryAttempts: 3, retryDelay: 1000 }),
    }),
    AuditModule,
    AuthModule,
    BenchesModule,
    HealthModule,
    IngestModule,
    LiveModule,
    OrganizationsModule,
    UsersModule,
    StandardsModule,
    InstrumentsModule,
    JobsModule,
    RunsModule,
    ReadingsModule,
    AnalysisModule,
    ImportsModule,
    ExportsModule,
    AttachmentsModule,
    ComparisonsModule,
    MailModule,
    BudgetsModule,
    CertificatesModule,
    ReviewsModule,
    RecallModule,
    PricesModule,
    QuotesModule,
    InvoicesModule,
    PaymentsModule,
  ],
})
export class AppModule {}
