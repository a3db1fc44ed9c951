import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Signed means frozen: versions of procedures and reference standards (an edit makes a new version), the
 * version of the standard a signed run used, and the record a certificate revision was signed with (plus
 * the instrument and customer as printed, for lists and the public page). Existing procedures and
 * standards get their version 1 from their current figures; existing certificates get the instrument and
 * customer as they stand now, which is the best that can be recovered for them.
 */
export class KeepSignedRecords1764700000000 implements MigrationInterface {
  name = 'KeepSignedRecords1764700000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`standard_versions\` (\`id\` int NOT NULL AUTO_INCREMENT, \`standard_id\` int NOT NULL, \`version\` int NOT NULL, \`figures\` json NOT NULL, \`created_by\` int NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`UQ_standard_versions_standard_version\` (\`standard_id\`, \`version\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`procedure_versions\` (\`id\` int NOT NULL AUTO_INCREMENT, \`procedure_id\` int NOT NULL, \`version\` int NOT NULL, \`figures\` json NOT NULL, \`created_by\` int NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`UQ_procedure_versions_procedure_version\` (\`procedure_id\`, \`version\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(`ALTER TABLE \`standards\` ADD \`version\` int NOT NULL DEFAULT '1'`);
    await queryRunner.query(`ALTER TABLE \`procedures\` ADD \`version\` int NOT NULL DEFAULT '1'`);
    await queryRunner.query(`ALTER TABLE \`runs\` ADD \`standard_version\` int NULL`);
    await queryRunner.query(`ALTER TABLE \`certificates\` ADD \`record\` json NULL`);
    await queryRunner.query(`ALTER TABLE \`certificates\` ADD \`instrument_label\` varchar(400) NULL`);
    await queryRunner.query(`ALTER TABLE \`certificates\` ADD \`customer_name\` varchar(200) NULL`);
    await queryRunner.query(
      `ALTER TABLE \`standard_versions\` ADD CONSTRAINT \`FK_standard_versions_standard\` FOREIGN KEY (\`standard_id\`) REFERENCES \`standards\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`procedure_versions\` ADD CONSTRAINT \`FK_procedure_versions_procedure\` FOREIGN KEY (\`procedure_id\`) REFERENCES \`procedures\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `INSERT INTO \`standard_versions\` (\`standard_id\`, \`version\`, \`figures\`)
       SELECT id, 1, JSON_OBJECT('id', id, 'version', 1, 'name', name, 'makeModel', make_model, 'serial', serial,
         'certificateNumber', certificate_number, 'dueDate', DATE_FORMAT(due_date, '%Y-%m-%d'),
         'timebaseAccuracyPpm', timebase_accuracy_ppm, 'resolutionHz', resolution_hz,
         'calibrationUPpm', calibration_u_ppm, 'calibrationK', calibration_k) FROM \`standards\``,
    );
    await queryRunner.query(
      `INSERT INTO \`procedure_versions\` (\`procedure_id\`, \`version\`, \`figures\`)
       SELECT id, 1, JSON_OBJECT('id', id, 'version', 1, 'name', name, 'method', method, 'decisionRule', decision_rule,
         'dialHalfDivisionPercentOfSpan', dial_half_division_pct, 'driftPpm', drift_ppm, 'driftHz', drift_hz,
         'extraComponents', JSON_EXTRACT(extra_components, '$')) FROM \`procedures\``,
    );
    await queryRunner.query(
      `UPDATE \`certificates\` c JOIN \`instruments\` i ON i.id = c.instrument_id JOIN \`organizations\` o ON o.id = c.organization_id
          SET c.instrument_label = CONCAT(i.make, ' ', i.model, ', serial ', i.serial), c.customer_name = o.name
        WHERE c.status <> 'draft'`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`procedure_versions\` DROP FOREIGN KEY \`FK_procedure_versions_procedure\``);
    await queryRunner.query(`ALTER TABLE \`standard_versions\` DROP FOREIGN KEY \`FK_standard_versions_standard\``);
    await queryRunner.query(`ALTER TABLE \`certificates\` DROP COLUMN \`customer_name\``);
    await queryRunner.query(`ALTER TABLE \`certificates\` DROP COLUMN \`instrument_label\``);
    await queryRunner.query(`ALTER TABLE \`certificates\` DROP COLUMN \`record\``);
    await queryRunner.query(`ALTER TABLE \`runs\` DROP COLUMN \`standard_version\``);
    await queryRunner.query(`ALTER TABLE \`procedures\` DROP COLUMN \`version\``);
    await queryRunner.query(`ALTER TABLE \`standards\` DROP COLUMN \`version\``);
    await queryRunner.query(`DROP INDEX \`UQ_procedure_versions_procedure_version\` ON \`procedure_versions\``);
    await queryRunner.query(`DROP TABLE \`procedure_versions\``);
    await queryRunner.query(`DROP INDEX \`UQ_standard_versions_standard_version\` ON \`standard_versions\``);
    await queryRunner.query(`DROP TABLE \`standard_versions\``);
  }
}
