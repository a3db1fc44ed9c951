import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { StandardsModule } from '../standards/standards.module.js';
import { Bench } from './bench.entity.js';
import { BenchesController } from './benches.controller.js';
import { BenchesService } from './benches.service.js';
import { RunBenchReader } from './run-bench.reader.js';

@Module({
  imports: [TypeOrmModule.forFeature([Bench]), StandardsModule],
  controllers: [BenchesController],
  providers: [BenchesService, RunBenchReader],
  exports: [BenchesService, RunBenchReader],
})
export class BenchesModule {}
