import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Card payments of invoices through the payment service (one row per attempt, with what was refunded of it), and
 * every service event applied, by its id, so a replayed webhook changes nothing.
 */
export class AddPayments1765130000000 implements MigrationInterface {
  name = 'AddPayments1765130000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'CREATE TABLE `payment_events` (`event_id` varchar(255) NOT NULL, `type` varchar(100) NOT NULL, `payment_id` int NULL, `outcome` varchar(500) NOT NULL, `received_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), PRIMARY KEY (`event_id`)) ENGINE=InnoDB',
    );
    await queryRunner.query(
      "CREATE TABLE `payments` (`id` int NOT NULL AUTO_INCREMENT, `invoice_id` int NOT NULL, `organization_id` int NOT NULL, `status` varchar(16) NOT NULL, `amount_minor` bigint NOT NULL, `refunded_minor` bigint NOT NULL DEFAULT '0', `currency` char(3) NOT NULL, `provider_session_id` varchar(255) NOT NULL, `provider_payment_id` varchar(255) NULL, `failure_message` varchar(500) NULL, `created_by` int NULL, `created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), `updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX `UQ_payments_session` (`provider_session_id`), INDEX `IDX_payments_invoice` (`invoice_id`), INDEX `IDX_payments_provider_payment` (`provider_payment_id`), PRIMARY KEY (`id`)) ENGINE=InnoDB",
    );
    await queryRunner.query(
      'ALTER TABLE `payments` ADD CONSTRAINT `FK_payments_invoice` FOREIGN KEY (`invoice_id`) REFERENCES `invoices`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE `payments` ADD CONSTRAINT `FK_payments_organization` FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON DELETE RESTRICT ON UPDATE NO ACTION',
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `payments` DROP FOREIGN KEY `FK_payments_organization`');
    await queryRunner.query('ALTER TABLE `payments` DROP FOREIGN KEY `FK_payments_invoice`');
    await queryRunner.query('DROP TABLE `payments`');
    await queryRunner.query('DROP TABLE `payment_events`');
  }
}
