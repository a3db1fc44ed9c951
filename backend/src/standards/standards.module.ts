import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { StandardVersionRow } from './standard-version.entity.js';
import { Standard } from './standard.entity.js';
import { StandardResultsReader } from './standard-results.reader.js';
import { StandardUseReader } from './standard-use.reader.js';
import { StandardsController } from './standards.controller.js';
import { StandardsService } from './standards.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Standard, StandardVersionRow])],
  controllers: [StandardsController],
  providers: [StandardsService, StandardResultsReader, StandardUseReader],
  exports: [StandardsService, StandardResultsReader, StandardUseReader],
})
export class StandardsModule {}
