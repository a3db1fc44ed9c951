import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Response } from 'express';
import type { DataSource } from 'typeorm';
import { analyseCalibration, MetrologyError } from '@kilocycle/common/math';
import { READINGS_CSV_COLUMNS, RESULTS_CSV_COLUMNS, type DialLaw, type RunKind, type Tolerance } from '@kilocycle/common/types';
import { organizationScope, type AuthUser } from '../auth/auth-user.js';
import { attachmentDisposition, csvLine } from './csv.js';

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

function json<T>(value: unknown): T {
  return (typeof value === 'string' ? JSON.parse(value) : value) as T;
}

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
   * A job's results: per calibration run (as-found, as-left) and dial setting, the nominal, the mean of
   * the included readings, n, SD, the error in Hz, ppm and %, the tolerance and the outlier flag, by
   * common's analyseCalibration on the range's dial law and tolerance.
   */
  async results(actor: AuthUser, jobId: number, res: Response): Promise<void> {
    const [job] = await this.dataSource.query('SELECT id, number, organization_id FROM jobs WHERE id = ?', [jobId]);
    const scope = organizationScope(actor);
    if (!job || (scope !== null && Number(job.organization_id) !== scope)) throw new NotFoundException(`Job ${jobId} not found`);
    const runs: Array<Record<string, unknown>> = await this.dataSource.query(
      `SELECT r.id, r.kind, g.label, g.dial_unit, g.dial_law, g.tolerance
         FROM runs r JOIN instrument_ranges g ON g.id = r.range_id
        WHERE r.job_id = ? AND r.kind IN ('as_found', 'as_left') ORDER BY g.position, r.started_at, r.id`,
      [jobId],
    );
    let body = csvLine(RESULTS_CSV_COLUMNS);
    for (const run of runs) {
      const readings: Array<{ dial: number | null; frequency_hz: number; excluded: number }> = await this.dataSource.query(
        `SELECT r.dial, r.frequency_hz, (x.reading_id IS NOT NULL) AS excluded
           FROM readings r LEFT JOIN reading_exclusions x ON x.reading_id = r.id WHERE r.run_id = ? ORDER BY r.seq`,
        [run.id],
      );
      const base = [job.number, Number(run.id), run.kind as RunKind, run.label, null, run.dial_unit];
      const usable = readings.filter((r) => r.dial !== null).map((r) => ({ dial: Number(r.dial), frequency: Number(r.frequency_hz), excluded: Number(r.excluded) === 1 }));
      if (usable.filter((r) => !r.excluded).length === 0) {
        body += csvLine([...base, null, null, 0, null, null, null, null, null, null, 'no included readings with a dial setting']);
        continue;
      }
      try {
        const analysis = analyseCalibration({ law: json<DialLaw>(run.dial_law), tolerance: json<Tolerance>(run.tolerance), readings: usable });
        for (const p of analysis.points) {
          body += csvLine([
            job.number, Number(run.id), run.kind, run.label, p.dial, run.dial_unit, p.nominal, p.measured, p.n, p.sd,
            p.errorHz, p.errorPpm, p.errorPercent, p.toleranceHz, p.outlier, null,
          ]);
        }
      } catch (error) {
        if (!(error instanceof MetrologyError)) throw error;
        body += csvLine([...base, null, null, usable.length, null, null, null, null, null, null, error.message]);
      }
    }
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', attachmentDisposition(`${job.number}-results.csv`));
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(body);
  }
}

function num(value: RowCell): number | null {
  return value === null ? null : Number(value);
}

function toIso(value: RowCell): string | null {
  if (value === null) return null;
  const date = value instanceof Date ? value : new Date(String(value).replace(' ', 'T') + (String(value).endsWith('Z') ? '' : 'Z'));
  return Number.isNaN(date.getTime()) ? String(value) : date.toISOString();
}
