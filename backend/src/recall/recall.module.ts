import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RecallNotice } from './recall-notice.entity.js';
import { RecallController } from './recall.controller.js';
import { RecallService } from './recall.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([RecallNotice])],
  controllers: [RecallController],
  providers: [RecallService],
})
export class RecallModule {}
