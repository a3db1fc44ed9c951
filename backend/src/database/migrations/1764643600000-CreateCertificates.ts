import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Procedures and budget overrides, review history, settings, certificates, the mail fake's captured
 * messages and recall notices. A first procedure is inserted so a fresh lab can sign without set-up.
 */
export class CreateCertificates1764643600000 implements MigrationInterface {
  name = 'CreateCertificates1764643600000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`procedures\` (\`id\` int NOT NULL AUTO_INCREMENT, \`name\` varchar(120) NOT NULL, \`method\` text NOT NULL, \`decision_rule\` varchar(16) NOT NULL, \`dial_half_division_pct\` double NOT NULL, \`drift_ppm\` double NOT NULL DEFAULT '0', \`drift_hz\` double NOT NULL DEFAULT '0', \`extra_components\` json NOT NULL, \`is_default\` tinyint NOT NULL DEFAULT 0, \`active\` tinyint NOT NULL DEFAULT 1, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`UQ_procedures_name\` (\`name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(`CREATE TABLE \`job_procedures\` (\`job_id\` int NOT NULL, \`procedure_id\` int NOT NULL, PRIMARY KEY (\`job_id\`)) ENGINE=InnoDB`);
    await queryRunner.query(
      `CREATE TABLE \`run_budgets\` (\`run_id\` int NOT NULL, \`dial_half_division\` double NULL, \`drift_ppm\` double NULL, \`drift_hz\` double NULL, \`counter_resolution_hz\` double NULL, \`extra_components\` json NULL, \`note\` text NULL, \`updated_by\` int NULL, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (\`run_id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`certificates\` (\`id\` int NOT NULL AUTO_INCREMENT, \`number\` varchar(32) NOT NULL, \`revision\` int NOT NULL, \`status\` varchar(16) NOT NULL, \`job_id\` int NOT NULL, \`organization_id\` int NOT NULL, \`instrument_id\` int NOT NULL, \`signed_by\` int NULL, \`signed_at\` datetime(3) NULL, \`signing_meaning\` varchar(200) NULL, \`issued_at\` datetime(3) NULL, \`file_name\` varchar(80) NULL, \`sha256\` char(64) NULL, \`signature\` varchar(120) NULL, \`key_id\` char(16) NULL, \`replaces_revision\` int NULL, \`amendment_reason\` text NULL, \`withdrawn_reason\` text NULL, \`withdrawn_at\` datetime(3) NULL, \`superseded_at\` datetime(3) NULL, \`decision\` varchar(20) NULL, \`results\` json NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_certificates_job\` (\`job_id\`), UNIQUE INDEX \`UQ_certificates_file_name\` (\`file_name\`), INDEX \`IDX_certificates_organization_status\` (\`organization_id\`, \`status\`), UNIQUE INDEX \`UQ_certificates_number_revision\` (\`number\`, \`revision\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`settings\` (\`key\` varchar(64) NOT NULL, \`value\` json NOT NULL, \`updated_by\` int NULL, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (\`key\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`mail_messages\` (\`id\` int NOT NULL AUTO_INCREMENT, \`message_id\` varchar(255) NULL, \`kind\` varchar(32) NOT NULL, \`mail_from\` varchar(254) NOT NULL, \`rcpt_to\` json NOT NULL, \`subject\` varchar(500) NOT NULL, \`size\` int NOT NULL, \`attachment_count\` int NOT NULL DEFAULT '0', \`raw\` longtext NOT NULL, \`received_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_mail_messages_received\` (\`received_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`recall_notices\` (\`id\` int NOT NULL AUTO_INCREMENT, \`instrument_id\` int NOT NULL, \`due_date\` date NOT NULL, \`recipients\` json NOT NULL, \`sent_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`UQ_recall_notices_instrument_due\` (\`instrument_id\`, \`due_date\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`job_reviews\` (\`id\` int NOT NULL AUTO_INCREMENT, \`job_id\` int NOT NULL, \`action\` varchar(16) NOT NULL, \`actor_id\` int NULL, \`comment\` text NULL, \`at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_job_reviews_job\` (\`job_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`job_procedures\` ADD CONSTRAINT \`FK_job_procedures_job\` FOREIGN KEY (\`job_id\`) REFERENCES \`jobs\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`job_procedures\` ADD CONSTRAINT \`FK_job_procedures_procedure\` FOREIGN KEY (\`procedure_id\`) REFERENCES \`procedures\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`run_budgets\` ADD CONSTRAINT \`FK_run_budgets_run\` FOREIGN KEY (\`run_id\`) REFERENCES \`runs\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`certificates\` ADD CONSTRAINT \`FK_certificates_job\` FOREIGN KEY (\`job_id\`) REFERENCES \`jobs\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`certificates\` ADD CONSTRAINT \`FK_certificates_organization\` FOREIGN KEY (\`organization_id\`) REFERENCES \`organizations\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`certificates\` ADD CONSTRAINT \`FK_certificates_instrument\` FOREIGN KEY (\`instrument_id\`) REFERENCES \`instruments\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`certificates\` ADD CONSTRAINT \`FK_certificates_signed_by\` FOREIGN KEY (\`signed_by\`) REFERENCES \`users\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`recall_notices\` ADD CONSTRAINT \`FK_recall_notices_instrument\` FOREIGN KEY (\`instrument_id\`) REFERENCES \`instruments\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`job_reviews\` ADD CONSTRAINT \`FK_job_reviews_job\` FOREIGN KEY (\`job_id\`) REFERENCES \`jobs\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `INSERT INTO \`procedures\` (\`name\`, \`method\`, \`decision_rule\`, \`dial_half_division_pct\`, \`drift_ppm\`, \`drift_hz\`, \`extra_components\`, \`is_default\`) VALUES (?, ?, 'simple', 0.25, 1, 0, '[]', 1)`,
      [
        'Dial calibration by direct comparison',
        'The output at each marked setting is measured with a frequency counter referenced to the standard named below, ' +
          'after the warm-up the owner states; readings are repeated at each setting, before (as found) and after (as left) any adjustment.',
      ],
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`job_reviews\` DROP FOREIGN KEY \`FK_job_reviews_job\``);
    await queryRunner.query(`ALTER TABLE \`recall_notices\` DROP FOREIGN KEY \`FK_recall_notices_instrument\``);
    await queryRunner.query(`ALTER TABLE \`certificates\` DROP FOREIGN KEY \`FK_certificates_signed_by\``);
    await queryRunner.query(`ALTER TABLE \`certificates\` DROP FOREIGN KEY \`FK_certificates_instrument\``);
    await queryRunner.query(`ALTER TABLE \`certificates\` DROP FOREIGN KEY \`FK_certificates_organization\``);
    await queryRunner.query(`ALTER TABLE \`certificates\` DROP FOREIGN KEY \`FK_certificates_job\``);
    await queryRunner.query(`ALTER TABLE \`run_budgets\` DROP FOREIGN KEY \`FK_run_budgets_run\``);
    await queryRunner.query(`ALTER TABLE \`job_procedures\` DROP FOREIGN KEY \`FK_job_procedures_procedure\``);
    await queryRunner.query(`ALTER TABLE \`job_procedures\` DROP FOREIGN KEY \`FK_job_procedures_job\``);
    await queryRunner.query(`DROP INDEX \`IDX_job_reviews_job\` ON \`job_reviews\``);
    await queryRunner.query(`DROP TABLE \`job_reviews\``);
    await queryRunner.query(`DROP INDEX \`UQ_recall_notices_instrument_due\` ON \`recall_notices\``);
    await queryRunner.query(`DROP TABLE \`recall_notices\``);
    await queryRunner.query(`DROP INDEX \`IDX_mail_messages_received\` ON \`mail_messages\``);
    await queryRunner.query(`DROP TABLE \`mail_messages\``);
    await queryRunner.query(`DROP TABLE \`settings\``);
    await queryRunner.query(`DROP INDEX \`UQ_certificates_number_revision\` ON \`certificates\``);
    await queryRunner.query(`DROP INDEX \`IDX_certificates_organization_status\` ON \`certificates\``);
    await queryRunner.query(`DROP INDEX \`UQ_certificates_file_name\` ON \`certificates\``);
    await queryRunner.query(`DROP INDEX \`IDX_certificates_job\` ON \`certificates\``);
    await queryRunner.query(`DROP TABLE \`certificates\``);
    await queryRunner.query(`DROP TABLE \`run_budgets\``);
    await queryRunner.query(`DROP TABLE \`job_procedures\``);
    await queryRunner.query(`DROP INDEX \`UQ_procedures_name\` ON \`procedures\``);
    await queryRunner.query(`DROP TABLE \`procedures\``);
  }
}
