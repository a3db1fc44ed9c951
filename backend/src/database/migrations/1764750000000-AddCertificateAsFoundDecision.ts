import type { MigrationInterface, QueryRunner } from 'typeorm';

const SEVERITY = ['pass', 'conditional_pass', 'conditional_fail', 'fail'];

type StoredResults = { ranges?: Array<{ points?: Array<{ asFound?: { decision?: string | null } | null }> }> };

/**
 * The as-found outcome of each certificate, for lists, the portal and the e-mail. Certificates signed
 * before this get it from the results stored with them (the worst as-found decision; kept here as
 * plain code so the migration stays as it was written).
 */
export class AddCertificateAsFoundDecision1764750000000 implements MigrationInterface {
  name = 'AddCertificateAsFoundDecision1764750000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `certificates` ADD `as_found_decision` varchar(20) NULL');
    const rows: Array<{ id: number; results: unknown }> = await queryRunner.query('SELECT id, results FROM `certificates` WHERE results IS NOT NULL');
    for (const row of rows) {
      const results = (typeof row.results === 'string' ? JSON.parse(row.results) : row.results) as StoredResults;
      let worst = -1;
      for (const range of results.ranges ?? []) {
        for (const point of range.points ?? []) worst = Math.max(worst, SEVERITY.indexOf(point.asFound?.decision ?? ''));
      }
      if (worst >= 0) await queryRunner.query('UPDATE `certificates` SET `as_found_decision` = ? WHERE id = ?', [SEVERITY[worst], row.id]);
    }
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `certificates` DROP COLUMN `as_found_decision`');
  }
}
