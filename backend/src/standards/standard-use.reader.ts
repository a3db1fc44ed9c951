import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { dateOnly } from '../shared/dto-helpers.js';
import { Standard } from './standard.entity.js';

/** A standard as a run that uses it needs it: its name, whether it is in use, and when it is due (YYYY-MM-DD). */
export type StandardUse = { id: number; name: string; active: boolean; dueDate: string };

/** Standards as the runs module reads them when a run is opened or corrected (in the caller's transaction when a manager is given). */
@Injectable()
export class StandardUseReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The standard, or null when there is no such standard. */
  async standard(id: number, manager?: EntityManager): Promise<StandardUse | null> {
    const row = await (manager ?? this.dataSource.manager).findOneBy(Standard, { id });
    return row ? { id: row.id, name: row.name, active: row.active, dueDate: dateOnly(row.dueDate)! } : null;
  }
}
