import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import type { ImportPhase, ImportProgress } from '@kilocycle/common/types';

type Entry = { userId: number; progress: ImportProgress; finishedAt: number | null };

/** Finished imports stay readable this long, so a page that polls late still sees the end. */
const KEEP_FINISHED_MS = 15 * 60 * 1000;
const MAX_ENTRIES = 2000;

/** Where each pass of an import sits in the bar: receiving 0–0.1, then the passes. */
const PHASE_SPAN: Record<'all' | 'valid', Partial<Record<ImportPhase, [number, number]>>> = {
  all: { receiving: [0, 0.1], validating: [0.1, 0.3], writing: [0.3, 1] },
  valid: { receiving: [0, 0.1], writing: [0.1, 1] },
};

/**
 * The server side of an import's progress bar, in memory and keyed by an id the page chooses
 * (`?importId=`), so the page can poll GET /api/imports/:importId/progress while its own upload is
 * still going. One process, one map: progress is not shared between server instances.
 */
@Injectable()
export class ImportProgressStore {
  private readonly entries = new Map<string, Entry>();

  start(importId: string, userId: number, runId: number, mode: 'all' | 'valid', bytesTotal: number | null): ImportTracker {
    this.prune();
    const existing = this.entries.get(importId);
    if (existing && existing.finishedAt === null) throw new ConflictException(`an import with id ${importId} is already running`);
    const entry: Entry = {
      userId,
      finishedAt: null,
      progress: {
        importId,
        runId,
        phase: 'receiving',
        bytesTotal,
        bytesDone: 0,
        rowsDone: 0,
        rowsRejected: 0,
        imported: 0,
        fraction: 0,
        message: null,
        updatedAt: new Date().toISOString(),
      },
    };
    this.entries.set(importId, entry);
    return new ImportTracker(entry, PHASE_SPAN[mode]);
  }

  /** The progress of an import the user started; 404 for anyone else's or an unknown id. */
  get(importId: string, userId: number): ImportProgress {
    const entry = this.entries.get(importId);
    if (!entry || entry.userId !== userId) throw new NotFoundException(`no import ${importId} (it may not have started yet)`);
    return { ...entry.progress };
  }

  private prune(): void {
    const now = Date.now();
    for (const [id, entry] of this.entries) if (entry.finishedAt !== null && now - entry.finishedAt > KEEP_FINISHED_MS) this.entries.delete(id);
    if (this.entries.size >= MAX_ENTRIES) {
      for (const [id, entry] of this.entries) {
        if (entry.finishedAt !== null) this.entries.delete(id);
        if (this.entries.size < MAX_ENTRIES / 2) break;
      }
    }
  }
}

/** Updates one import's progress; cheap enough to call every thousand rows. */
export class ImportTracker {
  constructor(
    private readonly entry: Entry,
    private readonly spans: Partial<Record<ImportPhase, [number, number]>>,
  ) {}

  get progress(): ImportProgress {
    return this.entry.progress;
  }

  update(patch: Partial<Pick<ImportProgress, 'phase' | 'bytesTotal' | 'bytesDone' | 'rowsDone' | 'rowsRejected' | 'imported'>>): void {
    const p = this.entry.progress;
    Object.assign(p, patch);
    const span = this.spans[p.phase];
    if (span) {
      const share = p.bytesTotal && p.bytesTotal > 0 ? Math.min(1, p.bytesDone / p.bytesTotal) : 0;
      p.fraction = Math.max(p.fraction, span[0] + (span[1] - span[0]) * share);
    }
    p.updatedAt = new Date().toISOString();
  }

  finish(outcome: { ok: true } | { ok: false; message: string }): void {
    const p = this.entry.progress;
    p.phase = outcome.ok ? 'done' : 'failed';
    if (outcome.ok) p.fraction = 1;
    else p.message = outcome.message;
    p.updatedAt = new Date().toISOString();
    this.entry.finishedAt = Date.now();
  }
}
