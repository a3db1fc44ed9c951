import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { Instrument } from './instrument.entity.js';

/** An instrument as a certificate identifies it, with the recall interval its issue restarts. */
export type CertificateInstrument = Pick<
  Instrument,
  'id' | 'organizationId' | 'make' | 'model' | 'serial' | 'assetTag' | 'description' | 'recallIntervalMonths'
>;

/**
 * Instruments for the certificates module (inside the signing transaction when a manager is given): reads the
 * identity a certificate prints and writes the next due date its issue sets. Also built by hand
 * (`new CertificateInstrumentWriter(dataSource)`) for the demo seed.
 */
@Injectable()
export class CertificateInstrumentWriter {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The instrument, or null. */
  async identity(id: number, manager?: EntityManager): Promise<CertificateInstrument | null> {
    const found = await (manager ?? this.dataSource.manager).findOneBy(Instrument, { id });
    if (!found) return null;
    const { organizationId, make, model, serial, assetTag, description, recallIntervalMonths } = found;
    return { id: found.id, organizationId, make, model, serial, assetTag, description, recallIntervalMonths };
  }

  /** The recall cycle restarts at issue: the next due date becomes `from` plus the instrument's interval (none without one). */
  async restartRecall(instrument: Pick<CertificateInstrument, 'id' | 'recallIntervalMonths'>, from: Date, manager: EntityManager): Promise<void> {
    if (instrument.recallIntervalMonths <= 0) return;
    const due = new Date(from);
    due.setUTCMonth(due.getUTCMonth() + instrument.recallIntervalMonths);
    await manager.update(Instrument, { id: instrument.id }, { nextDueDate: due.toISOString().slice(0, 10) });
  }
}
