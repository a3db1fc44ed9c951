import { ConflictException, Injectable, Logger, NotFoundException, ServiceUnavailableException, type OnModuleDestroy } from '@nestjs/common';
import { Subject } from 'rxjs';
import type { ImportPhase, ImportProgress } from '@kilocycle/common/types';
import { SharedRedis } from '../cluster/cluster.module.js';

type Entry = { userId: number; progress: ImportProgress; finishedAt: number | null };

/** An import's progress as the live socket pushes it, to the user who started it. */
export type ImportProgressChange = { userId: number; progress: ImportProgress };

/** Finished imports stay readable this long, so a page reloaded late still sees the end. */
const KEEP_FINISHED_MS = 15 * 60 * 1000;
/** A running import's state outlives a node that died mid-import by this long at most. */
const KEEP_RUNNING_MS = 60 * 60 * 1000;
const MAX_ENTRIES = 2000;
/** At most one push (and one Redis write) per import in this time; a phase change and the end go at once. */
const PUSH_EVERY_MS = 200;
const redisKey = (importId: string) => `kc:import:${importId}`;

/** Where each pass of an import sits in the bar: receiving 0–0.1, then the passes. */
const PHASE_SPAN: Record<'all' | 'valid', Partial<Record<ImportPhase, [number, number]>>> = {
  all: { receiving: [0, 0.1], validating: [0.1, 0.3], writing: [0.3, 1] },
  valid: { receiving: [0, 0.1], writing: [0.1, 1] },
};

/**
 * The server side of an import's progress bar, keyed by an id the page chooses (`?importId=`). Each change is
 * pushed over the live socket to the importing user's room (`changes$`, which the live gateway sends on: through
 * the Redis adapter it reaches the user's pages on any node), a few times a second at most. The state a page
 * reads after a reload (GET /api/imports/:importId/progress) is kept where every node finds it: in the shared
 * Redis in cluster mode (one key per import, expiring 15 minutes after the end), in memory in the single
 * process, which is then the only one. Progress is shown, never relied on: a Redis write that fails is logged
 * and the import goes on.
 */
@Injectable()
export class ImportProgressService implements OnModuleDestroy {
  private readonly logger = new Logger('ImportProgress');
  private readonly entries = new Map<string, Entry>();
  private readonly subject = new Subject<ImportProgressChange>();
  readonly changes$ = this.subject.asObservable();
  private redisFailing = false;

  constructor(private readonly redis: SharedRedis) {}

  onModuleDestroy(): void {
    this.subject.complete();
  }

  async start(importId: string, userId: number, runId: number, mode: 'all' | 'valid', bytesTotal: number | null): Promise<ImportTracker> {
    this.prune();
    const progress: ImportProgress = {
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
    };
    const entry: Entry = { userId, finishedAt: null, progress };
    const running = () => new ConflictException(`an import with id ${importId} is already running`);
    if (this.redis.enabled) {
      // Claimed with NX so that two nodes never run one id; a finished one may be reused. With Redis away the
      // import still runs (its bar then shows only what the socket pushes).
      try {
        const claimed = await this.redis.client.set(redisKey(importId), JSON.stringify(entry), 'PX', KEEP_RUNNING_MS, 'NX');
        if (claimed === null) {
          const before = await this.read(importId);
          if (before && before.finishedAt === null) throw running();
          await this.redis.client.set(redisKey(importId), JSON.stringify(entry), 'PX', KEEP_RUNNING_MS);
        }
      } catch (error) {
        if (error instanceof ConflictException) throw error;
        this.logger.warn(`import ${importId}: its progress could not be stored in Redis: ${error instanceof Error ? error.message : String(error)}`);
      }
    } else {
      const existing = this.entries.get(importId);
      if (existing && existing.finishedAt === null) throw running();
      this.entries.set(importId, entry);
    }
    const tracker = new ImportTracker(entry, PHASE_SPAN[mode], (e, force) => this.changed(e, force));
    this.subject.next({ userId, progress: { ...progress } });
    return tracker;
  }

  /** The progress of an import the user started; 404 for anyone else's or an unknown id. */
  async get(importId: string, userId: number): Promise<ImportProgress> {
    const entry = this.redis.enabled ? await this.read(importId) : this.entries.get(importId);
    if (!entry || entry.userId !== userId) throw new NotFoundException(`no import ${importId} (it may not have started yet)`);
    return { ...entry.progress };
  }

  private async read(importId: string): Promise<Entry | null> {
    let text: string | null;
    try {
      text = await this.redis.client.get(redisKey(importId));
    } catch {
      throw new ServiceUnavailableException('the shared store of import progress (Redis) cannot be reached just now; try again in a moment');
    }
    return text === null ? null : (JSON.parse(text) as Entry);
  }

  /** Pushes the entry's state and, in cluster mode, stores it in Redis (resolved once stored, or the failure logged). */
  private async changed(entry: Entry, finished: boolean): Promise<void> {
    this.subject.next({ userId: entry.userId, progress: { ...entry.progress } });
    if (!this.redis.enabled) return;
    try {
      await this.redis.client.set(redisKey(entry.progress.importId), JSON.stringify(entry), 'PX', finished ? KEEP_FINISHED_MS : KEEP_RUNNING_MS);
      if (this.redisFailing) this.logger.warn('import progress is being stored in Redis again');
      this.redisFailing = false;
    } catch (error) {
      if (!this.redisFailing) this.logger.warn(`import progress could not be stored in Redis: ${error instanceof Error ? error.message : String(error)}`);
      this.redisFailing = true;
    }
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

/** Updates one import's progress; cheap enough to call every thousand rows (what it pushes is throttled). */
export class ImportTracker {
  private lastPush = 0;
  private lastPhase: ImportPhase;
  private timer: NodeJS.Timeout | null = null;

  constructor(
    private readonly entry: Entry,
    private readonly spans: Partial<Record<ImportPhase, [number, number]>>,
    private readonly push: (entry: Entry, finished: boolean) => Promise<void>,
  ) {
    this.lastPhase = entry.progress.phase;
    this.lastPush = Date.now();
  }

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
    this.schedule();
  }

  /** The end, pushed at once; resolves when it is stored where every node reads it (never rejects). */
  finish(outcome: { ok: true } | { ok: false; message: string }): Promise<void> {
    const p = this.entry.progress;
    p.phase = outcome.ok ? 'done' : 'failed';
    if (outcome.ok) p.fraction = 1;
    else p.message = outcome.message;
    p.updatedAt = new Date().toISOString();
    this.entry.finishedAt = Date.now();
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    return this.push(this.entry, true);
  }

  /** A new phase goes out at once; otherwise at most one push per PUSH_EVERY_MS, the last change always included. */
  private schedule(): void {
    if (this.entry.finishedAt !== null) return;
    const wait = PUSH_EVERY_MS - (Date.now() - this.lastPush);
    if (this.entry.progress.phase !== this.lastPhase || wait <= 0) {
      this.flush();
      return;
    }
    if (!this.timer) {
      this.timer = setTimeout(() => this.flush(), wait);
      this.timer.unref();
    }
  }

  private flush(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    if (this.entry.finishedAt !== null) return;
    this.lastPush = Date.now();
    this.lastPhase = this.entry.progress.phase;
    void this.push(this.entry, false);
  }
}
