import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Quotes of jobs and their lines: amounts in integer minor units rounded per line, the customer's tax treatment
 * when priced, the PDF sent (a file in stored_files), and the customer's decision (who, when, how, with a note).
 */
export class AddQuotes1765110000000 implements MigrationInterface {
  name = 'AddQuotes1765110000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      "CREATE TABLE `quotes` (`id` int NOT NULL AUTO_INCREMENT, `number` varchar(16) NULL, `job_id` int NOT NULL, `organization_id` int NOT NULL, `status` varchar(16) NOT NULL, `currency` char(3) NOT NULL, `tax_exempt` tinyint NOT NULL DEFAULT 0, `tax_registration` varchar(64) NULL, `tax_rate_basis_points` int NOT NULL DEFAULT '0', `net_minor` bigint NOT NULL DEFAULT '0', `tax_minor` bigint NOT NULL DEFAULT '0', `gross_minor` bigint NOT NULL DEFAULT '0', `validity_days` int NOT NULL, `notes` text NULL, `pdf_file_id` int NULL, `sent_at` datetime(3) NULL, `valid_until` date NULL, `decided_at` datetime(3) NULL, `decided_by` int NULL, `acceptance_channel` varchar(16) NULL, `decision_note` text NULL, `created_by` int NOT NULL, `created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), `updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX `UQ_quotes_number` (`number`), INDEX `IDX_quotes_organization_status` (`organization_id`, `status`), INDEX `IDX_quotes_job_status` (`job_id`, `status`), PRIMARY KEY (`id`)) ENGINE=InnoDB",
    );
    await queryRunner.query(
      'CREATE TABLE `quote_lines` (`id` int NOT NULL AUTO_INCREMENT, `quote_id` int NOT NULL, `position` int NOT NULL, `price_item_id` int NULL, `code` varchar(32) NULL, `description` varchar(500) NOT NULL, `unit` varchar(16) NOT NULL, `quantity_milli` bigint NOT NULL, `unit_price_minor` bigint NOT NULL, `tax_rate_basis_points` int NOT NULL, `net_minor` bigint NOT NULL, `tax_minor` bigint NOT NULL, `gross_minor` bigint NOT NULL, UNIQUE INDEX `UQ_quote_lines_position` (`quote_id`, `position`), PRIMARY KEY (`id`)) ENGINE=InnoDB',
    );
    await queryRunner.query(
      'ALTER TABLE `quotes` ADD CONSTRAINT `FK_quotes_job` FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `quotes` ADD CONSTRAINT `FK_quotes_organization` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `quotes` ADD CONSTRAINT `FK_quotes_decided_by` FOREIGN KEY (`decided_by`) REFERENCES `users`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `quotes` ADD CONSTRAINT `FK_quotes_created_by` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `quote_lines` ADD CONSTRAINT `FK_quote_lines_quote` FOREIGN KEY (`quote_id`) REFERENCES `quotes`(`id`) ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `quote_lines` ADD CONSTRAINT `FK_quote_lines_price_item` FOREIGN KEY (`price_item_id`) REFERENCES `price_items`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `quote_lines` DROP FOREIGN KEY `FK_quote_lines_price_item`');
    await queryRunner.query('ALTER TABLE `quote_lines` DROP FOREIGN KEY `FK_quote_lines_quote`');
    await queryRunner.query('ALTER TABLE `quotes` DROP FOREIGN KEY `FK_quotes_created_by`');
    await queryRunner.query('ALTER TABLE `quotes` DROP FOREIGN KEY `FK_quotes_decided_by`');
    await queryRunner.query('ALTER TABLE `quotes` DROP FOREIGN KEY `FK_quotes_organization`');
    await queryRunner.query('ALTER TABLE `quotes` DROP FOREIGN KEY `FK_quotes_job`');
    await queryRunner.query('DROP TABLE `quote_lines`');
    await queryRunner.query('DROP TABLE `quotes`');
  }
}
