import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Saved comparisons of warm-up and stability runs, and photo/document attachments on instruments and jobs. */
export class CreateStudiesAndAttachments1764654000000 implements MigrationInterface {
  name = 'CreateStudiesAndAttachments1764654000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`attachments\` (\`id\` int NOT NULL AUTO_INCREMENT, \`instrument_id\` int NULL, \`job_id\` int NULL, \`storage_name\` char(32) NOT NULL, \`original_name\` varchar(255) NOT NULL, \`caption\` varchar(500) NULL, \`content_type\` varchar(64) NOT NULL, \`size_bytes\` int NOT NULL, \`sha256\` char(64) NOT NULL, \`uploaded_by\` int NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`UQ_attachments_storage_name\` (\`storage_name\`), INDEX \`IDX_attachments_job\` (\`job_id\`), INDEX \`IDX_attachments_instrument\` (\`instrument_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`comparisons\` (\`id\` int NOT NULL AUTO_INCREMENT, \`title\` varchar(200) NOT NULL, \`notes\` text NULL, \`instrument_id\` int NOT NULL, \`kind\` varchar(16) NOT NULL, \`run_ids\` json NOT NULL, \`labels\` json NOT NULL, \`within_hz\` double NULL, \`window_seconds\` double NULL, \`created_by\` int NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`IDX_comparisons_instrument\` (\`instrument_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`attachments\` ADD CONSTRAINT \`FK_attachments_instrument\` FOREIGN KEY (\`instrument_id\`) REFERENCES \`instruments\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`attachments\` ADD CONSTRAINT \`FK_attachments_job\` FOREIGN KEY (\`job_id\`) REFERENCES \`jobs\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`attachments\` ADD CONSTRAINT \`FK_attachments_uploaded_by\` FOREIGN KEY (\`uploaded_by\`) REFERENCES \`users\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`comparisons\` ADD CONSTRAINT \`FK_comparisons_instrument\` FOREIGN KEY (\`instrument_id\`) REFERENCES \`instruments\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`comparisons\` ADD CONSTRAINT \`FK_comparisons_created_by\` FOREIGN KEY (\`created_by\`) REFERENCES \`users\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`comparisons\` DROP FOREIGN KEY \`FK_comparisons_created_by\``);
    await queryRunner.query(`ALTER TABLE \`comparisons\` DROP FOREIGN KEY \`FK_comparisons_instrument\``);
    await queryRunner.query(`ALTER TABLE \`attachments\` DROP FOREIGN KEY \`FK_attachments_uploaded_by\``);
    await queryRunner.query(`ALTER TABLE \`attachments\` DROP FOREIGN KEY \`FK_attachments_job\``);
    await queryRunner.query(`ALTER TABLE \`attachments\` DROP FOREIGN KEY \`FK_attachments_instrument\``);
    await queryRunner.query(`DROP INDEX \`IDX_comparisons_instrument\` ON \`comparisons\``);
    await queryRunner.query(`DROP TABLE \`comparisons\``);
    await queryRunner.query(`DROP INDEX \`IDX_attachments_instrument\` ON \`attachments\``);
    await queryRunner.query(`DROP INDEX \`IDX_attachments_job\` ON \`attachments\``);
    await queryRunner.query(`DROP INDEX \`UQ_attachments_storage_name\` ON \`attachments\``);
    await queryRunner.query(`DROP TABLE \`attachments\``);
  }
}
