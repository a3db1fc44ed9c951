import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Organization } from './organization.entity.js';
import { OrganizationsController } from './organizations.controller.js';
import { OrganizationsReader } from './organizations.reader.js';
import { OrganizationsService } from './organizations.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Organization])],
  controllers: [OrganizationsController],
  providers: [OrganizationsService, OrganizationsReader],
  exports: [OrganizationsService, OrganizationsReader],
})
export class OrganizationsModule {}
