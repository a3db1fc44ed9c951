import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The price list (services with the lab's own code, a unit and a unit price in integer minor units), tax rates in
 * basis points, and each customer organisation's terms (tax rate or exempt with its registration number, payment
 * terms, whether work waits for an accepted quote). Organisations without terms get the defaults (prices module).
 */
export class AddPriceList1765100000000 implements MigrationInterface {
  name = 'AddPriceList1765100000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'CREATE TABLE `tax_rates` (`id` int NOT NULL AUTO_INCREMENT, `name` varchar(100) NOT NULL, `rate_basis_points` int NOT NULL, `active` tinyint NOT NULL DEFAULT 1, `created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), `updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX `UQ_tax_rates_name` (`name`), PRIMARY KEY (`id`)) ENGINE=InnoDB',
    );
    await queryRunner.query(
      "CREATE TABLE `customer_terms` (`organization_id` int NOT NULL, `tax_rate_id` int NULL, `tax_registration` varchar(64) NULL, `payment_terms` varchar(24) NOT NULL, `net_days` int NOT NULL DEFAULT '0', `requires_quote` tinyint NOT NULL DEFAULT 0, `updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (`organization_id`)) ENGINE=InnoDB",
    );
    await queryRunner.query(
      'CREATE TABLE `price_items` (`id` int NOT NULL AUTO_INCREMENT, `code` varchar(32) NOT NULL, `description` varchar(500) NOT NULL, `unit` varchar(16) NOT NULL, `unit_price_minor` bigint NOT NULL, `propose_on_quotes` tinyint NOT NULL DEFAULT 0, `active` tinyint NOT NULL DEFAULT 1, `created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), `updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX `UQ_price_items_code` (`code`), PRIMARY KEY (`id`)) ENGINE=InnoDB',
    );
    await queryRunner.query(
      'ALTER TABLE `customer_terms` ADD CONSTRAINT `FK_customer_terms_organization` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `customer_terms` ADD CONSTRAINT `FK_customer_terms_tax_rate` FOREIGN KEY (`tax_rate_id`) REFERENCES `tax_rates`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `customer_terms` DROP FOREIGN KEY `FK_customer_terms_tax_rate`');
    await queryRunner.query('ALTER TABLE `customer_terms` DROP FOREIGN KEY `FK_customer_terms_organization`');
    await queryRunner.query('DROP TABLE `price_items`');
    await queryRunner.query('DROP TABLE `customer_terms`');
    await queryRunner.query('DROP TABLE `tax_rates`');
  }
}
