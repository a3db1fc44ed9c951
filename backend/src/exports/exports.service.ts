import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Response } from 'express';
import type { DataSource } from 'typeorm';
import { READINGS_CSV_COLUMNS } from '@kilocycle/common/types';
import { organizationScope, type AuthUser } from '../auth/auth-user.js';
import { loadSignedRecord } from '../certificates/signed-record.js';
import { attachmentDisposition, csvLine } from '../shared/csv.js';
import { resultsCsv } from './results-csv.js';

// The part of a mysql2 (callback API) pool connection the export streams with.
type RowCell = number | string | Date | null;
type StreamingQuery = {
  on(event: 'result', listener: (row: RowCell[]) => void): StreamingQuery;
  on(event: 'error', listener: (error: Error) => void): StreamingQuery;
  on(event: 'end', listener: () => void): StreamingQuery;
};
type RawConnection = { query(options: { sql: string; values: unknown[]; rowsAsArray: boolean }): StreamingQuery; pause(): void; resume(): void };

/** Lines are gathered to about this many characters before each write to the response. */
const CHUNK = 64 * 1024;

/** CSV exports, in the same organisation scope as the pages: a client gets its own organisation's, anything else is 404. */
@Injectable()
export class ExportsService {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /**
   * Every reading of a run, excluded ones flagged with their reason, streamed from the database to the
   * response row by row (the driver is paused while the client catches up), never gathered in memory.
   */
  async readings(actor: AuthUser, runId: number, res: Response): Promise<void> {
    const [run] = await this.dataSource.query('SELECT r.id, j.organization_id, j.number FROM runs r JOIN jobs j ON j.id = r.job_id WHERE r.id = ?', [runId]);
    const scope = organizationScope(actor);
    if (!run || (scope !== null && Number(run.organization_id) !== scope)) throw new NotFoundException(`Run ${runId} not found`);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', attachmentDisposition(`${run.number}-run-${runId}-readings.csv`));
    res.setHeader('Cache-Control', 'private, no-store');
    let buffer = csvLine(READINGS_CSV_COLUMNS);
    const runner = this.dataSource.createQueryRunner();
    let gone = false;
    let connection: RawConnection | null = null;
    // A client that leaves: keep draining the result so the connection goes back to the pool clean.
    const onClose = () => {
      gone = true;
      connection?.resume();
    };
    const onDrain = () => connection?.resume();
    res.on('close', onClose);
    res.on('drain', onDrain);
    try {
      connection = (await runner.connect()) as RawConnection;
      const raw = connection;
      await new Promise<void>((resolve, reject) => {
        const flush = () => {
          if (!gone && !res.write(buffer)) raw.pause();
          buffer = '';
        };
        raw
          .query({
            sql: `SELECT r.seq, r.t_s, r.dial, r.frequency_hz, r.aux, r.source, r.received_at, x.reason
                    FROM readings r LEFT JOIN reading_exclusions x ON x.reading_id = r.id
                   WHERE r.run_id = ? ORDER BY r.seq`,
            values: [runId],
            rowsAsArray: true,
          })
          .on('result', (row) => {
            if (gone) return;
            const [seq, t, dial, frequency, aux, source, receivedAt, reason] = row;
            buffer += csvLine([num(seq), num(t), num(dial), num(frequency), num(aux), source, toIso(receivedAt), reason !== null, reason]);
            if (buffer.length >= CHUNK) flush();
          })
          .on('error', reject)
          .on('end', () => {
            flush();
            resolve();
          });
      });
      res.end();
    } catch (error) {
      // Once lines are out, end the response as broken rather than answer twice.
      if (!res.headersSent) throw error;
      res.destroy(error instanceof Error ? error : new Error(String(error)));
    } finally {
      res.off('close', onClose);
      res.off('drain', onDrain);
      await runner.release();
    }
  }

  /**
   * A job's results CSV (resultsCsv). A signed job's is the one stored with its signed record, byte for
   * byte, whatever has been edited since.
   */
  async results(actor: AuthUser, jobId: number, res: Response): Promise<void> {
    const [job] = await this.dataSource.query('SELECT id, number, organization_id FROM jobs WHERE id = ?', [jobId]);
    const scope = organizationScope(actor);
    if (!job || (scope !== null && Number(job.organization_id) !== scope)) throw new NotFoundException(`Job ${jobId} not found`);
    const signed = await loadSignedRecord(this.dataSource.manager, jobId);
    const body = signed?.record?.resultsCsv ?? (await resultsCsv(this.dataSource.manager, jobId, String(job.number)));
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', attachmentDisposition(`${signed?.record?.job.number ?? job.number}-results.csv`));
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(body);
  }
}

/**
 * A stored double as the figure it was entered as: rounded to 15 significant digits (DBL_DIG, the most a
 * double carries for any decimal), which drops the noise of unit arithmetic (1820.7497 kHz × 1000 is
 * stored as 1820749.7000000002) and keeps every digit a counter, a person or a file gave.
 */
function num(value: RowCell): number | null {
  if (value === null) return null;
  const n = Number(value);
  return Number.isFinite(n) ? Number(n.toPrecision(15)) : n;
}

function toIso(value: RowCell): string | null {
  if (value === null) return null;
  const date = value instanceof Date ? value : new Date(String(value).replace(' ', 'T') + (String(value).endsWith('Z') ? '' : 'Z'));
  return Number.isNaN(date.getTime()) ? String(value) : date.toISOString();
}
