import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Every reading names who or what entered it: the user (typed or imported) or the bench (bridge).
 * Columns added at the end of the table (an instant change in MariaDB, whatever the table's size);
 * the triggers that refuse UPDATE and DELETE on readings are untouched, so rows stored earlier keep
 * NULL: who entered them was never recorded, and guessing it now would put words in the record.
 */
export class AddReadingAuthors1764730000000 implements MigrationInterface {
  name = 'AddReadingAuthors1764730000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `readings` ADD `entered_by` int NULL, ADD `bench_id` int NULL');
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `readings` DROP COLUMN `bench_id`, DROP COLUMN `entered_by`');
  }
}
