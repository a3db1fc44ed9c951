import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { Instrument } from './instrument.entity.js';
import { instrumentLabel } from './instruments.service.js';

/** An instrument as a new job takes it: whose it is and how it is named. */
export type JobInstrument = { id: number; organizationId: number; label: string };

/** Instruments for the jobs module, which opens a job on one. */
@Injectable()
export class JobInstrumentReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /**
   * The instrument, or null; its row is locked (FOR UPDATE) in the caller's transaction, so two jobs
   * cannot open on it at once.
   */
  async lockForJob(id: number, manager: EntityManager = this.dataSource.manager): Promise<JobInstrument | null> {
    const found = await manager.findOne(Instrument, { where: { id }, lock: { mode: 'pessimistic_write' } });
    return found ? { id: found.id, organizationId: found.organizationId, label: instrumentLabel(found) } : null;
  }
}
