import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { In, LessThanOrEqual, type DataSource } from 'typeorm';
import { dateOnly } from '../shared/dto-helpers.js';
import { Instrument } from './instrument.entity.js';

/** An instrument as a recall reminder names it. */
export type RecallInstrument = { id: number; make: string; model: string; serial: string; organizationId: number; nextDueDate: string | null };

const toRecallInstrument = (i: Instrument): RecallInstrument => ({
  id: i.id,
  make: i.make,
  model: i.model,
  serial: i.serial,
  organizationId: i.organizationId,
  nextDueDate: dateOnly(i.nextDueDate),
});

/** Instruments for the recall module; also built by hand (`new RecallInstrumentsReader(dataSource)`) for the CLI. */
@Injectable()
export class RecallInstrumentsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** Instruments due on or before `until` (YYYY-MM-DD), by organisation, due date and id. */
  async dueBy(until: string): Promise<RecallInstrument[]> {
    const found = await this.dataSource.manager.find(Instrument, {
      where: { nextDueDate: LessThanOrEqual(until) }, // a NULL date compares as unknown: never due
      order: { organizationId: 'ASC', nextDueDate: 'ASC', id: 'ASC' },
    });
    return found.map(toRecallInstrument);
  }

  /** These instruments, by id. */
  async byIds(ids: readonly number[]): Promise<Map<number, RecallInstrument>> {
    const unique = [...new Set(ids)];
    if (unique.length === 0) return new Map();
    const found = await this.dataSource.manager.find(Instrument, { where: { id: In(unique) } });
    return new Map(found.map((i) => [i.id, toRecallInstrument(i)]));
  }
}
