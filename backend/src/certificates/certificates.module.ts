import { Module, RequestMethod, type MiddlewareConsumer, type NestModule } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Certificate } from './certificate.entity.js';
import { CertificatesController, PublicCertificatesController, SettingsController } from './certificates.controller.js';
import { CertificatesService } from './certificates.service.js';
import { CheckUploadMiddleware } from './check-upload.middleware.js';
import { Setting } from './setting.entity.js';
import { SigningKeyCheck } from './signing-key-check.js';

@Module({
  imports: [TypeOrmModule.forFeature([Certificate, Setting])],
  controllers: [CertificatesController, SettingsController, PublicCertificatesController],
  providers: [CertificatesService, SigningKeyCheck],
  exports: [CertificatesService],
})
export class CertificatesModule implements NestModule {
  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(CheckUploadMiddleware).forRoutes({ path: 'public/certificates/:number/check', method: RequestMethod.POST });
  }
}
