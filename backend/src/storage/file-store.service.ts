import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { Readable } from 'node:stream';
import type { DataSource, EntityManager } from 'typeorm';
import type { StoredFileKind } from './stored-file.entity.js';

export type { StoredFileKind } from './stored-file.entity.js';

/**
 * The largest part one row holds. A part travels as one INSERT (escaped as hex: twice its size) and one
 * line of a backup's dump, so 1 MiB keeps both far below max_allowed_packet on any MariaDB a lab runs,
 * and a large attachment is never held whole in memory on its way in or out.
 */
export const PART_BYTES = 1024 * 1024;

export type StoredFileInfo = { id: number; kind: StoredFileKind; sha256: string; sizeBytes: number; partCount: number };

/** Where the bytes come from: in memory (a certificate PDF) or a file on this node's disk (an upload in var/tmp). */
export type FileSource = Buffer | { path: string };

type HeadRow = { id: number; kind: StoredFileKind; sha256: string | null; size_bytes: number | null; part_count: number | null };

/** The bytes of a source in parts of exactly PART_BYTES (the last one shorter); an empty buffer is one empty part, an empty file none. */
async function* partsOf(source: FileSource): AsyncGenerator<Buffer> {
  if (Buffer.isBuffer(source)) {
    for (let offset = 0; offset === 0 || offset < source.length; offset += PART_BYTES) yield source.subarray(offset, offset + PART_BYTES);
    return;
  }
  let pending: Buffer = Buffer.alloc(0);
  for await (const chunk of createReadStream(source.path, { highWaterMark: PART_BYTES }) as AsyncIterable<Buffer>) {
    pending = pending.length === 0 ? chunk : Buffer.concat([pending, chunk]);
    while (pending.length >= PART_BYTES) {
      yield pending.subarray(0, PART_BYTES);
      pending = pending.subarray(PART_BYTES);
    }
  }
  if (pending.length > 0) yield pending;
}

/**
 * The one place certificate PDFs and attachments are kept: MariaDB's `stored_files` table, which every app
 * node reads, so a file written through one node is served and verified by any other. Writes run in the
 * caller's transaction (the row that names the file and the file commit or vanish together); reads check
 * the size and SHA-256 recorded at write time.
 */
@Injectable()
export class FileStore {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** Stores the bytes as a new file in the caller's transaction and answers its id, size and SHA-256. */
  async put(kind: StoredFileKind, source: FileSource, manager: EntityManager): Promise<StoredFileInfo> {
    // Outside a transaction a failure half-way would leave a head row without all its parts.
    if (!manager.queryRunner?.isTransactionActive) throw new Error('FileStore.put runs inside the transaction of the row that names the file');
    const hash = createHash('sha256');
    let sizeBytes = 0;
    let headId: number | null = null;
    let part = 0;
    let held: Buffer | null = null;
    let sawAny = false;
    for await (const chunk of partsOf(source)) {
      // One part is held back: the head row takes the file's figures at once when the file is one part.
      if (held) {
        headId = await this.writePart(manager, kind, headId, part, held);
        part += 1;
      }
      hash.update(chunk);
      sizeBytes += chunk.length;
      held = chunk;
      sawAny = true;
    }
    if (!sawAny || !held) held = Buffer.alloc(0); // an empty file on disk yields no part: it is one empty part here
    const sha256 = hash.digest('hex');
    const partCount = part + 1;
    if (headId === null) {
      const result: { insertId: number } = await manager.query(
        'INSERT INTO stored_files (file_id, part, kind, sha256, size_bytes, part_count, content) VALUES (NULL, 0, ?, ?, ?, 1, ?)',
        [kind, sha256, sizeBytes, held],
      );
      return { id: Number(result.insertId), kind, sha256, sizeBytes, partCount };
    }
    await this.writePart(manager, kind, headId, part, held);
    await manager.query('UPDATE stored_files SET sha256 = ?, size_bytes = ?, part_count = ? WHERE id = ?', [sha256, sizeBytes, partCount, headId]);
    return { id: headId, kind, sha256, sizeBytes, partCount };
  }

  /** The file's figures, or null when there is no such file of that kind. */
  async info(id: number, kind: StoredFileKind, manager: EntityManager = this.dataSource.manager): Promise<StoredFileInfo | null> {
    const rows: HeadRow[] = await manager.query(
      'SELECT id, kind, sha256, size_bytes, part_count FROM stored_files WHERE id = ? AND file_id IS NULL AND kind = ?',
      [id, kind],
    );
    const row = rows[0];
    if (!row || row.sha256 === null || row.size_bytes === null || row.part_count === null) return null;
    return { id: Number(row.id), kind: row.kind, sha256: row.sha256, sizeBytes: Number(row.size_bytes), partCount: Number(row.part_count) };
  }

  /** The whole file in memory (a certificate PDF is a few hundred kB), checked; null when there is no such file. */
  async get(id: number, kind: StoredFileKind, manager: EntityManager = this.dataSource.manager): Promise<Buffer | null> {
    const info = await this.info(id, kind, manager);
    if (!info) return null;
    const parts: Buffer[] = [];
    for await (const part of this.checkedParts(info, manager)) parts.push(part);
    return Buffer.concat(parts);
  }

  /**
   * The file part by part, for a response of any size: one part in memory at a time. The stream fails
   * (and so cuts the response short) if a part is missing or the bytes do not match the recorded SHA-256.
   */
  stream(info: StoredFileInfo, manager: EntityManager = this.dataSource.manager): Readable {
    return Readable.from(this.checkedParts(info, manager), { objectMode: false });
  }

  /** Deletes the file in the caller's transaction (with the row that named it). */
  async remove(id: number, manager: EntityManager): Promise<void> {
    await manager.query('DELETE FROM stored_files WHERE file_id = ?', [id]);
    await manager.query('DELETE FROM stored_files WHERE id = ? AND file_id IS NULL', [id]);
  }

  private async writePart(manager: EntityManager, kind: StoredFileKind, headId: number | null, part: number, content: Buffer): Promise<number> {
    if (headId === null) {
      // The head goes first (the parts name it); its figures are written once the last part is in.
      const result: { insertId: number } = await manager.query('INSERT INTO stored_files (file_id, part, kind, content) VALUES (NULL, 0, ?, ?)', [
        kind,
        content,
      ]);
      return Number(result.insertId);
    }
    await manager.query('INSERT INTO stored_files (file_id, part, kind, content) VALUES (?, ?, ?, ?)', [headId, part, kind, content]);
    return headId;
  }

  private async *checkedParts(info: StoredFileInfo, manager: EntityManager): AsyncGenerator<Buffer> {
    const hash = createHash('sha256');
    let size = 0;
    for (let part = 0; part < info.partCount; part += 1) {
      const rows: Array<{ content: Buffer }> =
        part === 0
          ? await manager.query('SELECT content FROM stored_files WHERE id = ?', [info.id])
          : await manager.query('SELECT content FROM stored_files WHERE file_id = ? AND part = ?', [info.id, part]);
      const content = rows[0]?.content;
      if (!content) throw new Error(`stored file ${info.id} is damaged: part ${part + 1} of ${info.partCount} is missing`);
      hash.update(content);
      size += content.length;
      yield content;
    }
    const sha256 = hash.digest('hex');
    if (size !== info.sizeBytes || sha256 !== info.sha256)
      throw new Error(`stored file ${info.id} is damaged: ${size} bytes with SHA-256 ${sha256}, recorded ${info.sizeBytes} bytes with ${info.sha256}`);
  }
}
