import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Invoices and credit notes (the invoices module): invoices with their lines, credit notes, the payments and refunds
 * the ledger records against them, and the gap-free number sequences of both (one row each, locked by the issuing
 * transaction).
 */
export class AddInvoices1765120000000 implements MigrationInterface {
  name = 'AddInvoices1765120000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'CREATE TABLE `document_sequences` (`name` varchar(32) NOT NULL, `next_value` int NOT NULL DEFAULT 1, PRIMARY KEY (`name`)) ENGINE=InnoDB',
    );
    await queryRunner.query("INSERT INTO `document_sequences` (`name`, `next_value`) VALUES ('invoice', 1), ('credit_note', 1)");
    await queryRunner.query(
      'CREATE TABLE `invoices` (`id` int NOT NULL AUTO_INCREMENT, `number` varchar(16) NULL, `job_id` int NOT NULL, `organization_id` int NOT NULL, ' +
        '`quote_id` int NULL, `status` varchar(16) NOT NULL, `currency` char(3) NOT NULL, `tax_exempt` tinyint NOT NULL DEFAULT 0, ' +
        '`tax_registration` varchar(64) NULL, `tax_rate_basis_points` int NOT NULL DEFAULT 0, `payment_terms` varchar(24) NOT NULL, `net_days` int NOT NULL DEFAULT 0, ' +
        '`net_minor` bigint NOT NULL DEFAULT 0, `tax_minor` bigint NOT NULL DEFAULT 0, `gross_minor` bigint NOT NULL DEFAULT 0, ' +
        '`paid_minor` bigint NOT NULL DEFAULT 0, `refunded_minor` bigint NOT NULL DEFAULT 0, `credited_minor` bigint NOT NULL DEFAULT 0, ' +
        '`issued_at` datetime(3) NULL, `issued_by` int NULL, `due_date` date NULL, `pdf_file_id` int NULL, `reminded_at` datetime(3) NULL, ' +
        '`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), `updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), ' +
        'UNIQUE INDEX `UQ_invoices_number` (`number`), UNIQUE INDEX `UQ_invoices_job` (`job_id`), INDEX `IDX_invoices_quote` (`quote_id`), ' +
        'INDEX `IDX_invoices_organization_status` (`organization_id`, `status`), INDEX `IDX_invoices_status_due` (`status`, `due_date`), PRIMARY KEY (`id`), ' +
        'CONSTRAINT `FK_invoices_job` FOREIGN KEY (`job_id`) REFERENCES `jobs` (`id`) ON DELETE RESTRICT ON UPDATE NO ACTION, ' +
        'CONSTRAINT `FK_invoices_organization` FOREIGN KEY (`organization_id`) REFERENCES `organizations` (`id`) ON DELETE RESTRICT ON UPDATE NO ACTION, ' +
        'CONSTRAINT `FK_invoices_issued_by` FOREIGN KEY (`issued_by`) REFERENCES `users` (`id`) ON DELETE RESTRICT ON UPDATE NO ACTION) ENGINE=InnoDB',
    );
    await queryRunner.query(
      'CREATE TABLE `invoice_lines` (`id` int NOT NULL AUTO_INCREMENT, `invoice_id` int NOT NULL, `position` int NOT NULL, `price_item_id` int NULL, ' +
        '`code` varchar(32) NULL, `description` varchar(500) NOT NULL, `unit` varchar(16) NOT NULL, `quantity_milli` bigint NOT NULL, `unit_price_minor` bigint NOT NULL, ' +
        '`tax_rate_basis_points` int NOT NULL, `net_minor` bigint NOT NULL, `tax_minor` bigint NOT NULL, `gross_minor` bigint NOT NULL, ' +
        'UNIQUE INDEX `UQ_invoice_lines_position` (`invoice_id`, `position`), PRIMARY KEY (`id`), ' +
        'CONSTRAINT `FK_invoice_lines_invoice` FOREIGN KEY (`invoice_id`) REFERENCES `invoices` (`id`) ON DELETE CASCADE ON UPDATE NO ACTION) ENGINE=InnoDB',
    );
    await queryRunner.query(
      'CREATE TABLE `credit_notes` (`id` int NOT NULL AUTO_INCREMENT, `number` varchar(16) NOT NULL, `invoice_id` int NOT NULL, `organization_id` int NOT NULL, ' +
        '`reason` varchar(500) NOT NULL, `net_minor` bigint NOT NULL, `tax_minor` bigint NOT NULL, `gross_minor` bigint NOT NULL, `payment_id` int NULL, ' +
        '`issued_at` datetime(3) NOT NULL, `issued_by` int NULL, `pdf_file_id` int NULL, ' +
        'UNIQUE INDEX `UQ_credit_notes_number` (`number`), INDEX `IDX_credit_notes_payment` (`payment_id`), ' +
        'INDEX `IDX_credit_notes_organization` (`organization_id`, `issued_at`), PRIMARY KEY (`id`), ' +
        'CONSTRAINT `FK_credit_notes_invoice` FOREIGN KEY (`invoice_id`) REFERENCES `invoices` (`id`) ON DELETE RESTRICT ON UPDATE NO ACTION, ' +
        'CONSTRAINT `FK_credit_notes_organization` FOREIGN KEY (`organization_id`) REFERENCES `organizations` (`id`) ON DELETE RESTRICT ON UPDATE NO ACTION, ' +
        'CONSTRAINT `FK_credit_notes_issued_by` FOREIGN KEY (`issued_by`) REFERENCES `users` (`id`) ON DELETE RESTRICT ON UPDATE NO ACTION) ENGINE=InnoDB',
    );
    await queryRunner.query(
      'CREATE TABLE `invoice_ledger_entries` (`id` int NOT NULL AUTO_INCREMENT, `invoice_id` int NOT NULL, `organization_id` int NOT NULL, `kind` varchar(8) NOT NULL, ' +
        '`amount_minor` bigint NOT NULL, `payment_id` int NULL, `at` datetime(3) NOT NULL, INDEX `IDX_invoice_ledger_entries_payment` (`payment_id`), ' +
        'INDEX `IDX_invoice_ledger_entries_organization` (`organization_id`, `at`), PRIMARY KEY (`id`), ' +
        'CONSTRAINT `FK_invoice_ledger_entries_invoice` FOREIGN KEY (`invoice_id`) REFERENCES `invoices` (`id`) ON DELETE RESTRICT ON UPDATE NO ACTION, ' +
        'CONSTRAINT `FK_invoice_ledger_entries_organization` FOREIGN KEY (`organization_id`) REFERENCES `organizations` (`id`) ON DELETE RESTRICT ON UPDATE NO ACTION) ENGINE=InnoDB',
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE `invoice_ledger_entries`');
    await queryRunner.query('DROP TABLE `credit_notes`');
    await queryRunner.query('DROP TABLE `invoice_lines`');
    await queryRunner.query('DROP TABLE `invoices`');
    await queryRunner.query('DROP TABLE `document_sequences`');
  }
}
