import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { Instrument } from './instrument.entity.js';

/** An instrument as a job's review and the returned-job mail name it (make, model and serial). */
export type ReviewInstrument = { id: number; make: string; model: string; serial: string };

/** Instruments for the reviews module (inside the caller's transaction when a manager is given). */
@Injectable()
export class ReviewInstrumentsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The instrument, or null. */
  async instrument(id: number, manager?: EntityManager): Promise<ReviewInstrument | null> {
    const found = await (manager ?? this.dataSource.manager).findOneBy(Instrument, { id });
    return found ? { id: found.id, make: found.make, model: found.model, serial: found.serial } : null;
  }
}
