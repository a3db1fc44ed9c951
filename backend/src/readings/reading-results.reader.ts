import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';

/** A reading with its exclusion reason (null when included). */
export type ResultsReading = { id: number; runId: number; seq: number; dial: number | null; frequency: number; excludedReason: string | null };

/** An excluded reading with its reason, who excluded it and when. */
export type ExcludedReadingRow = {
  readingId: number;
  runId: number;
  seq: number;
  dial: number | null;
  frequency: number;
  reason: string;
  excludedBy: number;
  excludedAt: Date;
};

/** Readings as job results read them (inside the signing transaction when a manager is given). */
@Injectable()
export class ReadingResultsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** Every reading of these runs, by run and sequence. */
  async readings(runIds: readonly number[], manager?: EntityManager): Promise<ResultsReading[]> {
    if (runIds.length === 0) return [];
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT r.id, r.run_id, r.seq, r.dial, r.frequency_hz, e.reason
         FROM readings r LEFT JOIN reading_exclusions e ON e.reading_id = r.id
        WHERE r.run_id IN (?) ORDER BY r.run_id, r.seq`,
      [runIds],
    );
    return rows.map((r) => ({
      id: Number(r.id),
      runId: Number(r.run_id),
      seq: Number(r.seq),
      dial: r.dial === null ? null : Number(r.dial),
      frequency: Number(r.frequency_hz),
      excludedReason: (r.reason as string | null) ?? null,
    }));
  }

  /** The frequencies of these readings in sequence order, with their ids. */
  async frequencies(ids: readonly number[], manager?: EntityManager): Promise<Array<{ id: number; frequency: number }>> {
    if (ids.length === 0) return [];
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      'SELECT id, frequency_hz FROM readings WHERE id IN (?) ORDER BY seq',
      [ids],
    );
    return rows.map((r) => ({ id: Number(r.id), frequency: Number(r.frequency_hz) }));
  }

  /** Per run with exclusions: how many readings are excluded and their distinct reasons ("; "-joined, sorted), by run. */
  async exclusionSummary(runIds: readonly number[], manager?: EntityManager): Promise<Array<{ runId: number; count: number; reasons: string }>> {
    if (runIds.length === 0) return [];
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT e.run_id, COUNT(*) AS n, GROUP_CONCAT(DISTINCT e.reason ORDER BY e.reason SEPARATOR '; ') AS reasons
         FROM reading_exclusions e WHERE e.run_id IN (?) GROUP BY e.run_id ORDER BY e.run_id`,
      [runIds],
    );
    return rows.map((row) => ({ runId: Number(row.run_id), count: Number(row.n), reasons: String(row.reasons) }));
  }

  /** The excluded readings of these runs, by run and sequence, with who excluded them and when. */
  async exclusions(runIds: readonly number[], manager?: EntityManager): Promise<ExcludedReadingRow[]> {
    if (runIds.length === 0) return [];
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT e.reading_id, e.run_id, x.seq, x.dial, x.frequency_hz, e.reason, e.excluded_by, e.excluded_at
         FROM reading_exclusions e JOIN readings x ON x.id = e.reading_id
        WHERE e.run_id IN (?) ORDER BY e.run_id, x.seq`,
      [runIds],
    );
    return rows.map((e) => ({
      readingId: Number(e.reading_id),
      runId: Number(e.run_id),
      seq: Number(e.seq),
      dial: e.dial === null ? null : Number(e.dial),
      frequency: Number(e.frequency_hz),
      reason: String(e.reason),
      excludedBy: Number(e.excluded_by),
      excludedAt: new Date(e.excluded_at as string),
    }));
  }
}
