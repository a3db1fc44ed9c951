import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * What a run's readings hold: 'frequency' (Hz, every run so far) or 'phase' (a time-interval counter's reading
 * against a reference, in seconds; stability runs only). A run holds one kind, named when it is opened, and the
 * reading's value column keeps the value in that kind's unit.
 */
export class AddRunDataKind1765140000000 implements MigrationInterface {
  name = 'AddRunDataKind1765140000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query("ALTER TABLE `runs` ADD `data_kind` varchar(12) NOT NULL DEFAULT 'frequency'");
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `runs` DROP COLUMN `data_kind`');
  }
}
