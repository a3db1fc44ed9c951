import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import { instrumentLabel } from './instruments.service.js';

/** Instruments and their ranges as comparisons name them. */
@Injectable()
export class InstrumentComparisonReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** "make model s/n serial" of these instruments, by id (ids not found are absent). */
  async labels(ids: readonly number[]): Promise<Map<number, string>> {
    if (ids.length === 0) return new Map();
    const rows: Array<Record<string, unknown>> = await this.dataSource.query('SELECT id, make, model, serial FROM instruments WHERE id IN (?)', [
      [...new Set(ids)],
    ]);
    return new Map(rows.map((row) => [Number(row.id), instrumentLabel({ make: String(row.make), model: String(row.model), serial: String(row.serial) })]));
  }

  /** The labels of these ranges, by id. */
  async rangeLabels(ids: readonly number[]): Promise<Map<number, string>> {
    if (ids.length === 0) return new Map();
    const rows: Array<Record<string, unknown>> = await this.dataSource.query('SELECT id, label FROM instrument_ranges WHERE id IN (?)', [[...new Set(ids)]]);
    return new Map(rows.map((row) => [Number(row.id), String(row.label)]));
  }
}
