import { Global, Module, RequestMethod, type MiddlewareConsumer, type NestModule } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Certificate } from './certificate.entity.js';
import { CertificatesController, PublicCertificatesController, SettingsController } from './certificates.controller.js';
import { CertificatesService } from './certificates.service.js';
import { CheckUploadMiddleware } from './check-upload.middleware.js';
import { Setting } from './setting.entity.js';
import { SignedResultsReader } from './signed-results.reader.js';
import { SignedResultsSource } from '../shared/signed-results.js';
import { SigningKeyCheck } from './signing-key-check.js';

/**
 * Global so that budgets can inject SignedResultsSource (declared in shared/, provided here) without importing
 * this module: certificates depends on budgets for a job's results, never the other way.
 */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([Certificate, Setting])],
  controllers: [CertificatesController, SettingsController, PublicCertificatesController],
  providers: [CertificatesService, SigningKeyCheck, SignedResultsReader, { provide: SignedResultsSource, useExisting: SignedResultsReader }],
  exports: [CertificatesService, SignedResultsSource],
})
export class CertificatesModule implements NestModule {
  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(CheckUploadMiddleware).forRoutes({ path: 'public/certificates/:number/check', method: RequestMethod.POST });
  }
}
