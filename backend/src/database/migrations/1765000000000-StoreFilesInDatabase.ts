import { Logger } from '@nestjs/common';
import { createHash, randomBytes } from 'node:crypto';
import { accessSync, closeSync, constants, existsSync, mkdirSync, openSync, readSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { MigrationInterface, QueryRunner } from 'typeorm';
import { loadConfig } from '../../config/app-config.js';

/** As storage/file-store.service.ts, written out here so that later changes to the store never change this migration. */
const PART_BYTES = 1024 * 1024;

type Found = { path: string; state: 'present' | 'missing' };
type CertificateFile = { id: number; number: string; revision: number; file_name: string; sha256: string | null };
type AttachmentFile = { id: number; storage_name: string; sha256: string; size_bytes: number };

/** A file named by a row: present, or missing (logged, the row then names no file). Unreadable, or not a file, stops the migration before it changes anything. */
function find(path: string, safeName: boolean): Found {
  if (!safeName || !existsSync(path)) return { path, state: 'missing' };
  if (!statSync(path).isFile())
    throw new Error(
      `${path} is not a file (a folder or a device is in its place): put the file back or move that away, and run the migration again. Nothing was changed.`,
    );
  try {
    accessSync(path, constants.R_OK);
  } catch (error) {
    throw new Error(
      `${path} exists but cannot be read (${(error as NodeJS.ErrnoException).code}): give the app's user read access and run the migration again. Nothing was changed.`,
      { cause: error },
    );
  }
  return { path, state: 'present' };
}

/** Copies a file into stored_files in parts of PART_BYTES (never whole in memory); answers the head row's id and the file's SHA-256. */
async function storeFile(queryRunner: QueryRunner, kind: string, path: string): Promise<{ id: number; sha256: string; size: number }> {
  const fd = openSync(path, 'r');
  try {
    const hash = createHash('sha256');
    const buffer = Buffer.alloc(PART_BYTES);
    let headId: number | null = null;
    let part = 0;
    let size = 0;
    for (;;) {
      let filled = 0;
      while (filled < PART_BYTES) {
        const n = readSync(fd, buffer, filled, PART_BYTES - filled, null);
        if (n === 0) break;
        filled += n;
      }
      if (filled === 0 && part > 0) break;
      const content = Buffer.from(buffer.subarray(0, filled));
      hash.update(content);
      size += filled;
      if (headId === null) {
        const result: { insertId: number } = await queryRunner.query('INSERT INTO stored_files (file_id, part, kind, content) VALUES (NULL, 0, ?, ?)', [
          kind,
          content,
        ]);
        headId = Number(result.insertId);
      } else {
        await queryRunner.query('INSERT INTO stored_files (file_id, part, kind, content) VALUES (?, ?, ?, ?)', [headId, part, kind, content]);
      }
      part += 1;
      if (filled < PART_BYTES) break;
    }
    const sha256 = hash.digest('hex');
    await queryRunner.query('UPDATE stored_files SET sha256 = ?, size_bytes = ?, part_count = ? WHERE id = ?', [sha256, size, part, headId]);
    return { id: headId!, sha256, size };
  } finally {
    closeSync(fd);
  }
}

/**
 * Certificate PDFs and attachments move from the node's var/ into MariaDB's `stored_files`, so that any app
 * node serves and verifies a file another node wrote. certificates.pdf_file_id and attachments.file_id name
 * the stored file; the file names on disk (file_name, storage_name) go.
 *
 * The move is done here, not at the app's start: migrations run with the app's configuration (loadConfig(),
 * the KC_VAR_DIR of `bin/kilocycle migrate` and of the start that runs it), once, before any node serves a
 * request, and a file is never half-moved by two nodes starting together. A file a row names but that is not
 * on disk is logged and the row is left naming no file (download answers 404); a file present but unreadable
 * stops the migration before anything changes. The files on disk are left where they are (nothing deletes a
 * record the operator may still want); once a backup has been taken they can be removed.
 *
 * MariaDB commits at each CREATE or ALTER TABLE, so the schema statements are idempotent (a second run after a
 * failure finishes the job), and the move itself runs in a transaction opened after them: all the files or none.
 */
export class StoreFilesInDatabase1765000000000 implements MigrationInterface {
  name = 'StoreFilesInDatabase1765000000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    const logger = new Logger('StoreFilesInDatabase');
    const varDir = loadConfig().varDir;
    const hasFileName = await queryRunner.hasColumn('certificates', 'file_name');
    const hasStorageName = await queryRunner.hasColumn('attachments', 'storage_name');
    const certificates: CertificateFile[] = hasFileName
      ? await queryRunner.query('SELECT id, number, revision, file_name, sha256 FROM certificates WHERE file_name IS NOT NULL ORDER BY id')
      : [];
    const attachments: AttachmentFile[] = hasStorageName
      ? await queryRunner.query('SELECT id, storage_name, sha256, size_bytes FROM attachments ORDER BY id')
      : [];
    // Every file is looked at before the schema changes, so an unreadable one stops the migration with nothing changed.
    const certificateFiles = certificates.map((c) => find(join(varDir, 'certificates', c.file_name), /^[0-9a-f]{40}\.pdf$/.test(c.file_name)));
    const attachmentFiles = attachments.map((a) => find(join(varDir, 'uploads', 'attachments', a.storage_name), /^[0-9a-f]{32}$/.test(a.storage_name)));

    await queryRunner.query(
      'CREATE TABLE IF NOT EXISTS `stored_files` (`id` int NOT NULL AUTO_INCREMENT, `file_id` int NULL, `part` int NOT NULL DEFAULT 0, `kind` varchar(32) NOT NULL, ' +
        '`sha256` char(64) NULL, `size_bytes` int NULL, `part_count` int NULL, `content` mediumblob NOT NULL, `created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), ' +
        'UNIQUE INDEX `UQ_stored_files_part` (`file_id`, `part`), PRIMARY KEY (`id`), ' +
        'CONSTRAINT `FK_stored_files_file` FOREIGN KEY (`file_id`) REFERENCES `stored_files` (`id`) ON DELETE CASCADE ON UPDATE NO ACTION) ENGINE=InnoDB',
    );
    await queryRunner.query(
      'ALTER TABLE `certificates` ADD COLUMN IF NOT EXISTS `pdf_file_id` int NULL, ADD UNIQUE INDEX IF NOT EXISTS `UQ_certificates_pdf_file` (`pdf_file_id`)',
    );
    await queryRunner.query(
      'ALTER TABLE `attachments` ADD COLUMN IF NOT EXISTS `file_id` int NULL, ADD UNIQUE INDEX IF NOT EXISTS `UQ_attachments_file` (`file_id`)',
    );

    // The schema statements above ended the migration's transaction (an implicit commit): the move gets its own.
    await queryRunner.query('START TRANSACTION');
    let moved = 0;
    let missing = 0;
    for (const [i, c] of certificates.entries()) {
      const found = certificateFiles[i]!;
      const [row] = await queryRunner.query('SELECT pdf_file_id FROM certificates WHERE id = ?', [c.id]);
      if (row?.pdf_file_id !== null && row?.pdf_file_id !== undefined) continue; // moved by an earlier, interrupted run
      if (found.state === 'missing') {
        missing += 1;
        logger.warn(
          `certificate ${c.number} revision ${c.revision}: its PDF ${found.path} was already missing; the certificate now names no file (its download answers 404)`,
        );
        continue;
      }
      const stored = await storeFile(queryRunner, 'certificate-pdf', found.path);
      if (c.sha256 !== null && stored.sha256 !== c.sha256)
        logger.warn(
          `certificate ${c.number} revision ${c.revision}: ${found.path} does not match the SHA-256 recorded at issue; moved as it is (it will not verify)`,
        );
      await queryRunner.query('UPDATE certificates SET pdf_file_id = ? WHERE id = ?', [stored.id, c.id]);
      moved += 1;
    }
    for (const [i, a] of attachments.entries()) {
      const found = attachmentFiles[i]!;
      const [row] = await queryRunner.query('SELECT file_id FROM attachments WHERE id = ?', [a.id]);
      if (row?.file_id !== null && row?.file_id !== undefined) continue;
      if (found.state === 'missing') {
        missing += 1;
        logger.warn(`attachment ${a.id}: its file ${found.path} was already missing; the attachment now names no file (its download answers 404)`);
        continue;
      }
      const stored = await storeFile(queryRunner, 'attachment', found.path);
      if (stored.sha256 !== a.sha256 || stored.size !== Number(a.size_bytes))
        logger.warn(`attachment ${a.id}: ${found.path} does not match the size and SHA-256 recorded at upload; moved as it is`);
      await queryRunner.query('UPDATE attachments SET file_id = ? WHERE id = ?', [stored.id, a.id]);
      moved += 1;
    }
    if (moved + missing > 0)
      logger.log(
        `moved ${moved} file(s) from ${varDir} into the database (table stored_files)${missing > 0 ? `; ${missing} named file(s) were missing (listed above)` : ''}. ` +
          'var/certificates and var/uploads/attachments are no longer read: keep them until a backup has been taken, then they may be deleted.',
      );

    // An ALTER commits the move above; the names on disk go with it.
    if (hasFileName) await queryRunner.query('ALTER TABLE `certificates` DROP INDEX IF EXISTS `UQ_certificates_file_name`, DROP COLUMN `file_name`');
    if (hasStorageName) await queryRunner.query('ALTER TABLE `attachments` DROP INDEX IF EXISTS `UQ_attachments_storage_name`, DROP COLUMN `storage_name`');
  }

  /** Writes each stored file back under var/ with a new random name, as the app before this migration kept them. */
  public async down(queryRunner: QueryRunner): Promise<void> {
    const varDir = loadConfig().varDir;
    await queryRunner.query('ALTER TABLE `certificates` ADD COLUMN IF NOT EXISTS `file_name` varchar(80) NULL');
    await queryRunner.query('ALTER TABLE `attachments` ADD COLUMN IF NOT EXISTS `storage_name` char(32) NULL');
    await queryRunner.query('START TRANSACTION');
    const writeBack = async (fileId: number | null, path: string): Promise<void> => {
      if (fileId === null) return;
      const [head] = await queryRunner.query('SELECT part_count FROM stored_files WHERE id = ?', [fileId]);
      if (!head) return;
      const parts: Buffer[] = [];
      for (let part = 0; part < Number(head.part_count); part += 1) {
        const [row] =
          part === 0
            ? await queryRunner.query('SELECT content FROM stored_files WHERE id = ?', [fileId])
            : await queryRunner.query('SELECT content FROM stored_files WHERE file_id = ? AND part = ?', [fileId, part]);
        parts.push(row.content as Buffer);
      }
      writeFileSync(path, Buffer.concat(parts), { mode: 0o640, flag: 'wx' });
    };
    const certificates: Array<{ id: number; pdf_file_id: number | null }> = await queryRunner.query(
      "SELECT id, pdf_file_id FROM certificates WHERE status <> 'draft' AND file_name IS NULL",
    );
    if (certificates.length > 0) mkdirSync(join(varDir, 'certificates'), { recursive: true, mode: 0o750 });
    for (const c of certificates) {
      const name = `${randomBytes(20).toString('hex')}.pdf`;
      await writeBack(c.pdf_file_id, join(varDir, 'certificates', name));
      await queryRunner.query('UPDATE certificates SET file_name = ? WHERE id = ?', [name, c.id]);
    }
    const attachments: Array<{ id: number; file_id: number | null }> = await queryRunner.query(
      'SELECT id, file_id FROM attachments WHERE storage_name IS NULL',
    );
    if (attachments.length > 0) mkdirSync(join(varDir, 'uploads', 'attachments'), { recursive: true, mode: 0o700 });
    for (const a of attachments) {
      const name = randomBytes(16).toString('hex');
      await writeBack(a.file_id, join(varDir, 'uploads', 'attachments', name));
      await queryRunner.query('UPDATE attachments SET storage_name = ? WHERE id = ?', [name, a.id]);
    }
    await queryRunner.query(
      'ALTER TABLE `certificates` DROP INDEX `UQ_certificates_pdf_file`, DROP COLUMN `pdf_file_id`, ADD UNIQUE INDEX `UQ_certificates_file_name` (`file_name`)',
    );
    await queryRunner.query(
      'ALTER TABLE `attachments` DROP INDEX `UQ_attachments_file`, DROP COLUMN `file_id`, MODIFY `storage_name` char(32) NOT NULL, ADD UNIQUE INDEX `UQ_attachments_storage_name` (`storage_name`)',
    );
    await queryRunner.query('DROP TABLE `stored_files`');
  }
}
