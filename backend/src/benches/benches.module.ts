import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Standard } from '../standards/standard.entity.js';
import { Bench } from './bench.entity.js';
import { BenchesController } from './benches.controller.js';
import { BenchesService } from './benches.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Bench, Standard])],
  controllers: [BenchesController],
  providers: [BenchesService],
  exports: [BenchesService],
})
export class BenchesModule {}
