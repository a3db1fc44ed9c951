import {
  BadRequestException,
  ConflictException,
  HttpException,
  Inject,
  Injectable,
  Logger,
  NotFoundException,
  type OnModuleInit,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Request, Response } from 'express';
import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { join } from 'node:path';
import Papa from 'papaparse';
import type { DataSource, EntityManager } from 'typeorm';
import {
  CALIBRATION_RUN_KINDS,
  DEFAULT_IMPORT_MAX_MB,
  IMPORT_COLUMNS,
  MAX_REPORTED_REJECTIONS,
  type ImportColumn,
  type ImportMode,
  type ImportRejection,
  type ImportReport,
} from '@kilocycle/common/types';
import { sniffContent } from '../shared/content-sniffer.js';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { ReadingsWriter, type RunWriteContext, type SpanConfirmation } from '../readings/readings-writer.service.js';
import { RunContextReader } from '../runs/run-context.reader.js';
import { RunNotesWriter } from '../runs/run-notes.writer.js';
import { assertMayWriteRun } from '../shared/run-write-guard.js';
import { runRefusalReason } from '@kilocycle/common/rules';
import {
  convertRow,
  detectDelimiter,
  detectNewline,
  ImportFileError,
  lastRecordEnd,
  needsTime,
  parseMapping,
  resolveColumns,
  type Delimiter,
  type Newline,
  type ResolvedColumns,
} from './csv-columns.js';
import type { ImportQueryDto } from './dto/import-query.dto.js';
import { ImportProgressService, type ImportTracker } from './import-progress.service.js';
import { ReadingBatch } from './reading-batch.js';
import { megabytesFromEnv, readHead, receiveUpload, removeQuietly, removeStaleUploads, type ReceivedUpload } from '../shared/multipart-upload.js';

/** How much of the run's notes the list of skipped rows may take (the column is TEXT, 64 KB). */
const NOTES_LIMIT = 60_000;
const NOTES_LISTED_ROWS = 100;
/** A record (line) longer than this is refused rather than buffered: most likely an unclosed quote. */
const MAX_RECORD_CHARS = 4_000_000;

type UploadedFile = { path: string; name: string; size: number; bomLength: number; delimiter: Delimiter; newline: Newline };
type PassResult = { rows: number };
/** One import as its steps share it: who, into which run, how, the file, its columns and the report being filled. */
type ImportJob = {
  actor: AuthUser;
  ctx: RunWriteContext;
  mode: ImportMode;
  importId: string;
  tracker: ImportTracker;
  confirm: SpanConfirmation;
  file: UploadedFile;
  columns: ResolvedColumns;
  report: ImportReport;
  record: (rejected: ImportRejection[]) => void;
};

/**
 * CSV/TSV import into a run (POST /api/runs/:id/imports). The upload streams to a temporary file;
 * the file is then read as a stream, row by row (papaparse), in batches of 1,000 through the shared
 * write path — never whole in memory. mode=all reads the file twice: first to validate every row
 * (nothing written if one is bad), then to write, all in one transaction. mode=valid writes the
 * valid rows in one pass and lists the skipped ones in the run's notes.
 */
@Injectable()
export class ImportsService implements OnModuleInit {
  private readonly logger = new Logger('Imports');
  readonly maxBytes = megabytesFromEnv('KC_IMPORT_MAX_MB', DEFAULT_IMPORT_MAX_MB);

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writer: ReadingsWriter,
    private readonly audit: AuditService,
    private readonly progress: ImportProgressService,
    private readonly runs: RunContextReader,
    private readonly notes: RunNotesWriter,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  /** Uploads a stopped server left half-checked in var/tmp are removed at start (after an hour, so a running upload is safe). */
  async onModuleInit(): Promise<void> {
    const removed = await removeStaleUploads(join(this.config.varDir, 'tmp'), 3600_000).catch(() => 0);
    if (removed > 0) this.logger.warn(`removed ${removed} unfinished upload(s) from ${join(this.config.varDir, 'tmp')}`);
  }

  async import(actor: AuthUser, runId: number, query: ImportQueryDto, req: Request, res: Response): Promise<ImportReport> {
    const ctx = await this.writer.loadContext(runId);
    const scope = organizationScope(actor);
    if (!ctx || (scope !== null && ctx.organizationId !== scope)) throw new NotFoundException(`Run ${runId} not found`);
    assertMayWriteRun(actor.role, ctx.kind);
    const refusal = runRefusalReason(ctx);
    if (refusal) throw new ConflictException(refusal);
    const mode: ImportMode = query.mode ?? 'all';
    const importId = query.importId ?? randomUUID();
    const length = Number(req.headers['content-length']);
    const tracker = await this.progress.start(importId, actor.id, runId, mode, Number.isFinite(length) && length > 0 ? length : null);
    let upload: ReceivedUpload | null = null;
    try {
      upload = await receiveUpload(req, res, {
        dir: join(this.config.varDir, 'tmp'),
        maxBytes: this.maxBytes,
        field: 'file',
        onBytes: (bytesDone, bytesTotal) => tracker.update({ bytesDone, bytesTotal }),
      });
      // Rows outside the range's span are bad rows unless the person confirmed the file as it is.
      const confirm: SpanConfirmation = query.confirmed === true ? 'all' : 'none';
      const report = await this.process(actor, ctx, upload, mode, importId, query.mapping ?? upload.fields.mapping, tracker, confirm);
      await tracker.finish({ ok: true });
      return report;
    } catch (error) {
      await tracker.finish({ ok: false, message: failureMessage(error) });
      throw error;
    } finally {
      if (upload) await removeQuietly(upload.path);
    }
  }

  private async process(
    actor: AuthUser,
    ctx: RunWriteContext,
    upload: ReceivedUpload,
    mode: ImportMode,
    importId: string,
    mappingText: string | undefined,
    tracker: ImportTracker,
    confirm: SpanConfirmation,
  ): Promise<ImportReport> {
    const file = await this.openFile(upload);
    const report: ImportReport = {
      importId,
      runId: ctx.runId,
      mode,
      imported: 0,
      rejected: [],
      rejectedCount: 0,
      rowCount: 0,
      columns: { time: null, dial: null, frequency: null, unit: null, aux: null },
      delimiter: file.delimiter,
      notesAppended: false,
    };
    const columns = await this.readColumns(file, ctx, mappingText, report);
    const record = (rejected: ImportRejection[]) => {
      report.rejectedCount += rejected.length;
      for (const r of rejected) if (report.rejected.length < MAX_REPORTED_REJECTIONS) report.rejected.push(r);
      tracker.update({ rowsRejected: report.rejectedCount });
    };
    const job: ImportJob = { actor, ctx, mode, importId, tracker, confirm, file, columns, report, record };
    // A file fault found past the header (a line that never ends) is the sender's, whichever phase meets it.
    try {
      if (mode === 'all') await this.validateAll(job);
      await this.writeAll(job);
    } catch (error) {
      if (error instanceof ImportFileError) throw refused(report, null, error.message);
      throw error;
    }
    return report;
  }

  /** The upload as a text file to parse: refused (415) unless it is CSV or TSV text; its newline and delimiter. */
  private async openFile(upload: ReceivedUpload): Promise<UploadedFile> {
    const head = await readHead(upload.path);
    const sniffed = sniffContent(head);
    if (!sniffed.text) throw new UnsupportedMediaTypeException(`the file is not CSV or TSV text (it looks like ${sniffed.description})`);
    const headText = Buffer.from(head.subarray(sniffed.bomLength)).toString('utf8');
    const firstLine = headText.split(/\r?\n|\r/)[0] ?? '';
    return {
      newline: detectNewline(headText),
      path: upload.path,
      name: upload.originalName,
      size: upload.size,
      bomLength: sniffed.bomLength,
      delimiter: detectDelimiter(firstLine, upload.originalName),
    };
  }

  /** The header's columns (with the mapping), checked against what the run's kind needs; a fault is refused as line 1. */
  private async readColumns(file: UploadedFile, ctx: RunWriteContext, mappingText: string | undefined, report: ImportReport): Promise<ResolvedColumns> {
    try {
      const columns = resolveColumns(await this.header(file), parseMapping(mappingText));
      report.columns = columns.names;
      if (needsTime(ctx.kind) && columns.index.time === null)
        throw new ImportFileError(`no time column: a ${ctx.kind} run needs the time of each reading (name a column time, t or seconds, or give a mapping)`);
      if (CALIBRATION_RUN_KINDS.includes(ctx.kind) && columns.index.dial === null)
        throw new ImportFileError(
          `no dial column: an ${ctx.kind} run needs the dial setting of each reading (name a column dial or setting, or give a mapping)`,
        );
      return columns;
    } catch (error) {
      if (error instanceof ImportFileError) throw refused(report, [{ line: 1, column: 'header', reason: error.message }], error.message);
      throw error;
    }
  }

  /** Pass 1 (mode all): validate every row; nothing is written unless all are good. */
  private async validateAll({ file, columns, ctx, tracker, confirm, report, record }: ImportJob): Promise<void> {
    const checked = await this.pass(file, columns, ctx, tracker, 'validating', async (batch) => {
      record(sortByLine([...batch.rejected, ...this.locate(this.writer.validate(ctx, batch.inputs(), Date.now(), confirm).rejected, batch, columns)]));
    });
    report.rowCount = checked.rows;
    if (report.rowCount === 0)
      throw refused(report, [{ line: 2, column: 'file', reason: 'the file has no readings under its header' }], 'the file has no readings under its header');
    if (report.rejectedCount > 0) {
      const rows = report.rejectedCount === 1 ? '1 row is' : `${report.rejectedCount} rows are`;
      throw refused(report, null, `${rows} not valid: nothing was imported (fix them, or import only the valid rows with mode=valid)`);
    }
  }

  /** The writing pass, in one transaction with the notes of skipped rows and the import's one audit event. */
  private async writeAll({ actor, ctx, mode, importId, tracker, confirm, file, columns, report, record }: ImportJob): Promise<void> {
    // Every reading names the importing user; the import as a whole is one audit event (below).
    const author = { kind: 'user' as const, id: actor.id, name: actor.name };
    await this.dataSource.transaction(async (manager) => {
      await this.lockRun(manager, ctx.runId);
      const written = await this.pass(file, columns, ctx, tracker, 'writing', async (batch) => {
        const result =
          batch.size === 0
            ? null
            : await this.writer.append(ctx, batch.inputs(), 'import', author, { manager, skipReadBack: true, callerAudits: true, confirm });
        const refusedNow = result ? this.locate(result.rejected, batch, columns) : [];
        // Pass 1 passed every row; a refusal now means the rules changed underneath: roll everything back.
        if (mode === 'all' && (refusedNow.length > 0 || batch.rejected.length > 0))
          throw new ConflictException('a row changed between validating and writing; nothing was imported');
        if (mode === 'valid') record(sortByLine([...batch.rejected, ...refusedNow]));
        report.imported += result?.accepted ?? 0;
        tracker.update({ imported: report.imported });
      });
      report.rowCount = written.rows;
      if (report.imported === 0) {
        const reason = report.rowCount === 0 ? 'the file has no readings under its header' : 'no row of the file is valid: nothing was imported';
        throw refused(report, report.rowCount === 0 ? [{ line: 2, column: 'file', reason }] : null, reason);
      }
      if (mode === 'valid' && report.rejectedCount > 0) {
        await this.appendNotes(manager, actor, ctx.runId, file.name, report);
        report.notesAppended = true;
      }
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'run',
          entityId: ctx.runId,
          action: 'import',
          changes: {
            file: file.name,
            bytes: file.size,
            mode,
            rows: report.rowCount,
            imported: report.imported,
            skipped: report.rejectedCount,
            importId,
            source: 'import',
            author,
          },
        },
        manager,
      );
    });
  }

  /** Locks the run (and its job) for the import's transaction and checks again that it takes readings. */
  private async lockRun(manager: EntityManager, runId: number): Promise<void> {
    const row = await this.runs.lockStatus(runId, manager);
    const refusal = row ? runRefusalReason({ runId, ...row }) : `there is no run ${runId}`;
    if (refusal) throw new ConflictException(refusal);
  }

  /** The header row (the file's first line). */
  private async header(file: UploadedFile): Promise<string[]> {
    const state = { line: 1 };
    for await (const block of this.blocks(file, () => undefined)) {
      let header: string[] | null = null;
      this.parseBlock(block, file, state, (_line, cells) => {
        header ??= cells;
      });
      if (header) return header;
    }
    throw new ImportFileError('the file is empty');
  }

  /**
   * The file as it streams off the disk, in blocks of whole records (about 64 kB): each block is cut
   * at the last line break outside quotes, so a quoted cell may hold line breaks.
   */
  private async *blocks(file: UploadedFile, onBytes: (bytes: number) => void): AsyncGenerator<string> {
    const stream = createReadStream(file.path, { start: file.bomLength, encoding: 'utf8', highWaterMark: 64 * 1024 });
    let pending = '';
    try {
      for await (const chunk of stream as AsyncIterable<string>) {
        pending += chunk;
        const end = lastRecordEnd(pending, file.newline);
        if (end < 0) {
          if (pending.length > MAX_RECORD_CHARS)
            throw new ImportFileError(`a line runs on for more than ${MAX_RECORD_CHARS / 1_000_000} million characters: is a quote left open?`);
          continue;
        }
        // The block stops before its last line break, so papaparse sees no empty row after it.
        const block = pending.slice(0, end - file.newline.length);
        pending = pending.slice(end);
        yield block;
        onBytes(file.bomLength + stream.bytesRead);
      }
      if (pending !== '') yield pending;
    } finally {
      stream.destroy();
    }
  }

  /**
   * Parses one block with papaparse, row by row, handing each non-blank row and the line it starts on
   * to `visit` at once: no array of rows is built, so nothing of the text outlives its row.
   */
  private parseBlock(block: string, file: UploadedFile, state: { line: number }, visit: (line: number, cells: string[]) => void): void {
    Papa.parse<string[]>(block, {
      delimiter: file.delimiter,
      newline: file.newline,
      header: false,
      skipEmptyLines: false,
      step: (results) => {
        const cells = results.data;
        const start = state.line;
        state.line += 1;
        for (const cell of cells) if (cell.includes(file.newline)) state.line += cell.split(file.newline).length - 1;
        if (cells.length === 0 || (cells.length === 1 && cells[0]!.trim() === '')) return;
        visit(start, cells);
      },
    });
  }

  /**
   * One pass over the data rows: each converted and handed on in batches of MAX_BATCH. A block of the
   * file is converted whole before any batch of it goes to the database, so no text waits on a round trip.
   */
  private async pass(
    file: UploadedFile,
    columns: ResolvedColumns,
    ctx: RunWriteContext,
    tracker: ImportTracker,
    phase: 'validating' | 'writing',
    handle: (batch: ReadingBatch) => Promise<void>,
  ): Promise<PassResult> {
    tracker.update({ phase, bytesTotal: file.size, bytesDone: 0, rowsDone: 0 });
    const run = { kind: ctx.kind, dataKind: ctx.dataKind, startedAtMs: ctx.startedAt.getTime() };
    let rows = 0;
    let handled = 0;
    let header = true;
    let batch = new ReadingBatch(ctx.dataKind);
    const ready: ReadingBatch[] = [];
    const send = async (next: ReadingBatch) => {
      await handle(next);
      handled += next.size + next.rejected.length;
      tracker.update({ rowsDone: handled });
    };
    const state = { line: 1 };
    const visit = (line: number, cells: string[]) => {
      if (header) {
        header = false;
        return;
      }
      rows += 1;
      const converted = convertRow(cells, columns, run);
      if ('input' in converted) batch.add(line, converted.input);
      else batch.rejected.push({ line, column: columns.names[converted.column] ?? converted.column, reason: converted.reason });
      if (batch.full) {
        ready.push(batch);
        batch = new ReadingBatch(ctx.dataKind);
      }
    };
    for await (const block of this.blocks(file, (bytesDone) => tracker.update({ bytesDone }))) {
      this.parseBlock(block, file, state, visit);
      while (ready.length > 0) await send(ready.shift()!);
    }
    if (!batch.empty) await send(batch);
    tracker.update({ bytesDone: file.size, rowsDone: rows });
    return { rows };
  }

  /** The write path's refusals (by index in the batch) as lines and columns of the file. */
  private locate(rejected: ReadonlyArray<{ index: number; field: string; reason: string }>, batch: ReadingBatch, columns: ResolvedColumns): ImportRejection[] {
    const columnOf = (field: string): string => {
      const key: ImportColumn | null = field === 't' ? 'time' : (IMPORT_COLUMNS as readonly string[]).includes(field) ? (field as ImportColumn) : null;
      return key ? (columns.names[key] ?? key) : field;
    };
    return rejected.map((r) => ({ line: batch.lines[r.index]!, column: columnOf(r.field), reason: r.reason }));
  }

  /** Appends the skipped rows to the run's notes (the first hundred listed, within the column's size). */
  private async appendNotes(manager: EntityManager, actor: AuthUser, runId: number, fileName: string, report: ImportReport): Promise<void> {
    const existing = await this.notes.read(runId, manager);
    const when = new Date().toISOString().slice(0, 16).replace('T', ' ');
    const skipped = report.rejectedCount === 1 ? '1 row skipped' : `${report.rejectedCount} rows skipped`;
    const lines = [`Import of "${fileName}" on ${when} UTC by ${actor.name}: ${report.imported} readings imported, ${skipped}:`];
    let budget = NOTES_LIMIT - existing.length - lines[0]!.length - 200;
    let listed = 0;
    for (const r of report.rejected) {
      const text = `- line ${r.line}, ${r.column}: ${r.reason}`;
      if (listed >= NOTES_LISTED_ROWS || budget - text.length < 0) break;
      lines.push(text);
      budget -= text.length + 1;
      listed += 1;
    }
    if (listed < report.rejectedCount) lines.push(`- and ${report.rejectedCount - listed} more (the import report lists every row)`);
    const addition = lines.join('\n');
    const notes = existing.trim() === '' ? addition : `${existing.replace(/\s+$/, '')}\n\n${addition}`;
    await this.notes.write(runId, notes, manager);
  }
}

function sortByLine(rejected: ImportRejection[]): ImportRejection[] {
  return rejected.sort((a, b) => a.line - b.line);
}

/** The 400 of a refused import: Nest's error shape with the report (and nothing written). */
function refused(report: ImportReport, rejected: ImportRejection[] | null, message: string): BadRequestException {
  if (rejected) {
    report.rejected = rejected;
    report.rejectedCount = rejected.length;
  }
  return new BadRequestException({ statusCode: 400, error: 'Bad Request', message, ...report, imported: 0 });
}

function failureMessage(error: unknown): string {
  if (error instanceof HttpException) {
    const body = error.getResponse();
    const message = typeof body === 'object' && body !== null ? (body as { message?: unknown }).message : body;
    return Array.isArray(message) ? message.join('; ') : String(message ?? error.message);
  }
  return error instanceof Error ? error.message : String(error);
}
