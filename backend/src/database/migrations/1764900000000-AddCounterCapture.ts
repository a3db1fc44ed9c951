import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Counter-assisted capture: the procedure's settle rule (N readings within a band, a timeout) and its dial
 * marks; each settled setting with its n, SD and rule, and its links to the counter readings behind it
 * (the budget's repeatability uses their spread).
 */
export class AddCounterCapture1764900000000 implements MigrationInterface {
  name = 'AddCounterCapture1764900000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'CREATE TABLE `counter_captures` (`id` int NOT NULL AUTO_INCREMENT, `run_id` int NOT NULL, `reading_id` bigint NOT NULL, `dial` double NOT NULL, `n` int NOT NULL, `mean_hz` double NOT NULL, `sd_hz` double NOT NULL, `spread_hz` double NOT NULL, `settle_count` int NOT NULL, `tolerance_hz` double NOT NULL, `started_at` datetime(3) NOT NULL, `settled_at` datetime(3) NOT NULL, `started_by` int NOT NULL, INDEX `IDX_counter_captures_run` (`run_id`), UNIQUE INDEX `UQ_counter_captures_reading` (`reading_id`), PRIMARY KEY (`id`)) ENGINE=InnoDB',
    );
    await queryRunner.query(
      'CREATE TABLE `counter_capture_samples` (`reading_id` bigint NOT NULL, `capture_id` int NOT NULL, INDEX `IDX_counter_capture_samples_capture` (`capture_id`), PRIMARY KEY (`reading_id`)) ENGINE=InnoDB',
    );
    await queryRunner.query("ALTER TABLE `procedures` ADD `capture_settle_count` int NOT NULL DEFAULT '5'");
    await queryRunner.query("ALTER TABLE `procedures` ADD `capture_tolerance_hz` double NOT NULL DEFAULT '5'");
    await queryRunner.query("ALTER TABLE `procedures` ADD `capture_timeout_s` int NOT NULL DEFAULT '30'");
    await queryRunner.query('ALTER TABLE `procedures` ADD `dial_marks` json NULL');
    await queryRunner.query(
      'ALTER TABLE `counter_captures` ADD CONSTRAINT `FK_counter_captures_run` FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `counter_captures` ADD CONSTRAINT `FK_counter_captures_reading` FOREIGN KEY (`reading_id`) REFERENCES `readings`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `counter_capture_samples` ADD CONSTRAINT `FK_counter_capture_samples_reading` FOREIGN KEY (`reading_id`) REFERENCES `readings`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `counter_capture_samples` ADD CONSTRAINT `FK_counter_capture_samples_capture` FOREIGN KEY (`capture_id`) REFERENCES `counter_captures`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `counter_capture_samples` DROP FOREIGN KEY `FK_counter_capture_samples_capture`');
    await queryRunner.query('ALTER TABLE `counter_capture_samples` DROP FOREIGN KEY `FK_counter_capture_samples_reading`');
    await queryRunner.query('ALTER TABLE `counter_captures` DROP FOREIGN KEY `FK_counter_captures_reading`');
    await queryRunner.query('ALTER TABLE `counter_captures` DROP FOREIGN KEY `FK_counter_captures_run`');
    await queryRunner.query('ALTER TABLE `procedures` DROP COLUMN `dial_marks`');
    await queryRunner.query('ALTER TABLE `procedures` DROP COLUMN `capture_timeout_s`');
    await queryRunner.query('ALTER TABLE `procedures` DROP COLUMN `capture_tolerance_hz`');
    await queryRunner.query('ALTER TABLE `procedures` DROP COLUMN `capture_settle_count`');
    await queryRunner.query('DROP TABLE `counter_capture_samples`');
    await queryRunner.query('DROP TABLE `counter_captures`');
  }
}
