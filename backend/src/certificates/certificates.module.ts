import { Global, Module, RequestMethod, type MiddlewareConsumer, type NestModule } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BudgetsModule } from '../budgets/budgets.module.js';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { OrganizationsModule } from '../organizations/organizations.module.js';
import { StandardsModule } from '../standards/standards.module.js';
import { StorageModule } from '../storage/storage.module.js';
import { Certificate } from './certificate.entity.js';
import { CertificateIssuer } from './certificate-issuer.service.js';
import { CertificateSettingsReader } from './certificate-settings.reader.js';
import { CertificatesController, PublicCertificatesController, SettingsController } from './certificates.controller.js';
import { CertificatesService } from './certificates.service.js';
import { CheckUploadMiddleware } from './check-upload.middleware.js';
import { Setting } from './setting.entity.js';
import { SignedRecordReader } from './signed-record.reader.js';
import { SignedResultsSource } from '../shared/signed-results.js';
import { SigningKeyCheck } from './signing-key-check.js';

/**
 * Global so that budgets can inject SignedResultsSource (declared in shared/, provided here) without importing
 * this module: certificates depends on budgets for a job's results, never the other way.
 */
@Global()
@Module({
  // The owners of what a certificate is signed from (runs, readings, users and audit are global), and the file store that keeps the PDFs.
  imports: [
    TypeOrmModule.forFeature([Certificate, Setting]),
    JobsModule,
    InstrumentsModule,
    OrganizationsModule,
    StandardsModule,
    BudgetsModule,
    StorageModule,
  ],
  controllers: [CertificatesController, SettingsController, PublicCertificatesController],
  providers: [
    CertificatesService,
    CertificateIssuer,
    CertificateSettingsReader,
    SigningKeyCheck,
    SignedRecordReader,
    { provide: SignedResultsSource, useExisting: SignedRecordReader },
  ],
  exports: [CertificatesService, CertificateIssuer, CertificateSettingsReader, SignedRecordReader, SignedResultsSource],
})
export class CertificatesModule implements NestModule {
  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(CheckUploadMiddleware).forRoutes({ path: 'public/certificates/:number/check', method: RequestMethod.POST });
  }
}
