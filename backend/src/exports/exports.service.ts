import { Injectable, NotFoundException } from '@nestjs/common';
import type { Response } from 'express';
import { readingsCsvColumns } from '@kilocycle/common/types';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { SignedRecordReader } from '../certificates/signed-record.reader.js';
import { RangeResultsReader } from '../instruments/range-results.reader.js';
import { JobsService } from '../jobs/jobs.service.js';
import { ReadingResultsReader } from '../readings/reading-results.reader.js';
import { RunReadingsReader, type StreamedCell, type StreamFlow } from '../readings/run-readings.reader.js';
import { RunContextReader } from '../runs/run-context.reader.js';
import { RunResultsReader } from '../runs/run-results.reader.js';
import { attachmentDisposition, csvLine } from '../shared/csv.js';
import { resultsCsv, type ResultsCsvSources } from '../shared/results-csv.js';

type RowCell = StreamedCell;

/** Lines are gathered to about this many characters before each write to the response. */
const CHUNK = 64 * 1024;

/** CSV exports, in the same organisation scope as the pages: a client gets its own organisation's, anything else is 404. */
@Injectable()
export class ExportsService {
  /** The owners' readers a job's results CSV is built from. */
  private readonly csvSources: ResultsCsvSources;

  constructor(
    private readonly runs: RunContextReader,
    private readonly readingsOf: RunReadingsReader,
    private readonly jobs: JobsService,
    private readonly signedRecords: SignedRecordReader,
    runResults: RunResultsReader,
    ranges: RangeResultsReader,
    readingResults: ReadingResultsReader,
  ) {
    this.csvSources = { runs: runResults, ranges, readings: readingResults };
  }

  /**
   * Every reading of a run, excluded ones flagged with their reason, streamed from the database to the
   * response row by row (the driver is paused while the client catches up), never gathered in memory.
   */
  async readings(actor: AuthUser, runId: number, res: Response): Promise<void> {
    const run = await this.runs.scope(runId);
    const scope = organizationScope(actor);
    if (!run || (scope !== null && run.organizationId !== scope)) throw new NotFoundException(`Run ${runId} not found`);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', attachmentDisposition(`${run.jobNumber}-run-${runId}-readings.csv`));
    res.setHeader('Cache-Control', 'private, no-store');
    let buffer = csvLine(readingsCsvColumns(run.dataKind));
    let gone = false;
    let connection: StreamFlow | null = null;
    // A client that leaves: keep draining the result so the connection goes back to the pool clean.
    const onClose = () => {
      gone = true;
      connection?.resume();
    };
    const onDrain = () => connection?.resume();
    res.on('close', onClose);
    res.on('drain', onDrain);
    const flush = () => {
      if (!gone && !res.write(buffer)) connection?.pause();
      buffer = '';
    };
    try {
      await this.readingsOf.streamExport(
        runId,
        (row) => {
          if (gone) return;
          const [seq, t, dial, frequency, aux, source, receivedAt, reason] = row;
          buffer += csvLine([num(seq), num(t), num(dial), num(frequency), num(aux), source, toIso(receivedAt), reason !== null, reason]);
          if (buffer.length >= CHUNK) flush();
        },
        (flow) => {
          connection = flow;
        },
      );
      // The connection is back in the pool: the last lines are written without pausing or resuming it.
      connection = null;
      flush();
      res.end();
    } catch (error) {
      // Once lines are out, end the response as broken rather than answer twice.
      if (!res.headersSent) throw error;
      res.destroy(error instanceof Error ? error : new Error(String(error)));
    } finally {
      res.off('close', onClose);
      res.off('drain', onDrain);
    }
  }

  /**
   * A job's results CSV (resultsCsv). A signed job's is the one stored with its signed record, byte for
   * byte, whatever has been edited since.
   */
  async results(actor: AuthUser, jobId: number, res: Response): Promise<void> {
    const job = await this.jobs.findVisible(actor, jobId);
    const signed = await this.signedRecords.signedRecord(jobId);
    const body = signed?.record?.resultsCsv ?? (await resultsCsv(this.csvSources, { id: jobId, number: String(job.number), instrumentId: job.instrumentId }));
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
