import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { InstrumentRange } from './instrument-range.entity.js';

/** Instruments as the price list counts them (a quote's per-range lines). */
@Injectable()
export class BillingInstrumentsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** How many ranges the instrument has, in the caller's transaction when one is given. */
  async rangeCount(instrumentId: number, manager?: EntityManager): Promise<number> {
    return (manager ?? this.dataSource.manager).countBy(InstrumentRange, { instrumentId });
  }
}
