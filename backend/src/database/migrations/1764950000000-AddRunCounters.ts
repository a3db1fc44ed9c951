import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Per-run counters kept by the readings write path in the same transaction as each stored batch and each
 * exclusion, so that no list or page counts a run's readings on request: how many readings, how many excluded,
 * and the highest seq stored. Existing runs are filled from their readings.
 */
export class AddRunCounters1764950000000 implements MigrationInterface {
  name = 'AddRunCounters1764950000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      "ALTER TABLE `runs` ADD `reading_count` int NOT NULL DEFAULT '0', ADD `excluded_count` int NOT NULL DEFAULT '0', ADD `last_seq` int NOT NULL DEFAULT '0'",
    );
    await queryRunner.query(
      `UPDATE runs r
          LEFT JOIN (SELECT run_id, COUNT(*) AS n, MAX(seq) AS last FROM readings GROUP BY run_id) k ON k.run_id = r.id
          LEFT JOIN (SELECT run_id, COUNT(*) AS n FROM reading_exclusions GROUP BY run_id) x ON x.run_id = r.id
          SET r.reading_count = COALESCE(k.n, 0), r.last_seq = COALESCE(k.last, 0), r.excluded_count = COALESCE(x.n, 0)`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `runs` DROP COLUMN `last_seq`, DROP COLUMN `excluded_count`, DROP COLUMN `reading_count`');
  }
}
