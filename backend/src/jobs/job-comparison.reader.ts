import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';

/** A job as a comparison of runs names it. */
export type ComparedJob = { id: number; number: string; instrumentId: number };

/** Jobs as comparisons read them. */
@Injectable()
export class JobComparisonReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** These jobs by id (ids not found are absent). */
  async jobs(ids: readonly number[]): Promise<Map<number, ComparedJob>> {
    if (ids.length === 0) return new Map();
    return this.select('WHERE id IN (?)', [[...new Set(ids)]]);
  }

  /** Every job of an instrument, by id. */
  async ofInstrument(instrumentId: number): Promise<Map<number, ComparedJob>> {
    return this.select('WHERE instrument_id = ?', [instrumentId]);
  }

  private async select(where: string, parameters: unknown[]): Promise<Map<number, ComparedJob>> {
    const rows: Array<Record<string, unknown>> = await this.dataSource.query(`SELECT id, number, instrument_id FROM jobs ${where}`, parameters);
    return new Map(rows.map((row) => [Number(row.id), { id: Number(row.id), number: String(row.number), instrumentId: Number(row.instrument_id) }]));
  }
}
