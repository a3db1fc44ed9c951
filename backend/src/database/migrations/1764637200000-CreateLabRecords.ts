import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Instruments and ranges, reference standards, benches, jobs, runs, readings and exclusions. */
export class CreateLabRecords1764637200000 implements MigrationInterface {
  name = 'CreateLabRecords1764637200000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`standards\` (\`id\` int NOT NULL AUTO_INCREMENT, \`name\` varchar(120) NOT NULL, \`kind\` varchar(16) NOT NULL, \`make_model\` varchar(160) NOT NULL, \`serial\` varchar(120) NOT NULL, \`certificate_number\` varchar(120) NOT NULL, \`due_date\` date NOT NULL, \`timebase_accuracy_ppm\` double NOT NULL, \`resolution_hz\` double NOT NULL, \`calibration_u_ppm\` double NOT NULL, \`calibration_k\` double NOT NULL DEFAULT '2', \`active\` tinyint NOT NULL DEFAULT 1, UNIQUE INDEX \`UQ_standards_name\` (\`name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`benches\` (\`id\` int NOT NULL AUTO_INCREMENT, \`name\` varchar(120) NOT NULL, \`location\` varchar(200) NULL, \`default_standard_id\` int NULL, \`token_hash\` char(64) NULL, \`token_issued_at\` datetime NULL, \`active\` tinyint NOT NULL DEFAULT 1, UNIQUE INDEX \`UQ_benches_name\` (\`name\`), UNIQUE INDEX \`UQ_benches_token_hash\` (\`token_hash\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`instruments\` (\`id\` int NOT NULL AUTO_INCREMENT, \`organization_id\` int NOT NULL, \`make\` varchar(120) NOT NULL, \`model\` varchar(120) NOT NULL, \`serial\` varchar(120) NOT NULL, \`asset_tag\` varchar(120) NULL, \`description\` text NULL, \`recall_interval_months\` int NOT NULL DEFAULT '12', \`next_due_date\` date NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`IDX_instruments_next_due\` (\`next_due_date\`), UNIQUE INDEX \`UQ_instruments_make_model_serial\` (\`make\`, \`model\`, \`serial\`), INDEX \`IDX_instruments_organization\` (\`organization_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`instrument_ranges\` (\`id\` int NOT NULL AUTO_INCREMENT, \`instrument_id\` int NOT NULL, \`position\` int NOT NULL, \`label\` varchar(60) NOT NULL, \`dial_unit\` varchar(8) NOT NULL, \`dial_law\` json NOT NULL, \`dial_min\` double NOT NULL, \`dial_max\` double NOT NULL, \`freq_min_hz\` double NOT NULL, \`freq_max_hz\` double NOT NULL, \`tolerance\` json NOT NULL, \`multipliers\` json NOT NULL, UNIQUE INDEX \`UQ_instrument_ranges_position\` (\`instrument_id\`, \`position\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`jobs\` (\`id\` int NOT NULL AUTO_INCREMENT, \`number\` varchar(32) NOT NULL, \`instrument_id\` int NOT NULL, \`organization_id\` int NOT NULL, \`status\` varchar(16) NOT NULL, \`received_date\` date NOT NULL, \`condition_received\` text NULL, \`technician_id\` int NULL, \`ambient_temp_c\` double NULL, \`humidity_pct\` double NULL, \`notes\` text NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`UQ_jobs_number\` (\`number\`), INDEX \`IDX_jobs_organization_status\` (\`organization_id\`, \`status\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`runs\` (\`id\` int NOT NULL AUTO_INCREMENT, \`job_id\` int NOT NULL, \`range_id\` int NOT NULL, \`kind\` varchar(24) NOT NULL, \`status\` varchar(8) NOT NULL DEFAULT 'open', \`bench_id\` int NULL, \`standard_id\` int NULL, \`standard_override_reason\` text NULL, \`supply_voltage\` double NULL, \`configuration\` text NULL, \`notes\` text NULL, \`started_at\` datetime(3) NOT NULL, \`ended_at\` datetime(3) NULL, \`created_by\` int NOT NULL, INDEX \`IDX_runs_bench_status\` (\`bench_id\`, \`status\`), INDEX \`IDX_runs_job\` (\`job_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`readings\` (\`id\` bigint NOT NULL AUTO_INCREMENT, \`run_id\` int NOT NULL, \`seq\` int NOT NULL, \`t_s\` double NOT NULL, \`dial\` double NULL, \`frequency_hz\` double NOT NULL, \`aux\` double NULL, \`source\` varchar(8) NOT NULL, \`received_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`UQ_readings_run_seq\` (\`run_id\`, \`seq\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`reading_exclusions\` (\`reading_id\` bigint NOT NULL, \`run_id\` int NOT NULL, \`reason\` varchar(500) NOT NULL, \`excluded_by\` int NOT NULL, \`excluded_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_reading_exclusions_run\` (\`run_id\`), PRIMARY KEY (\`reading_id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`benches\` ADD CONSTRAINT \`FK_benches_default_standard\` FOREIGN KEY (\`default_standard_id\`) REFERENCES \`standards\`(\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`instruments\` ADD CONSTRAINT \`FK_instruments_organization\` FOREIGN KEY (\`organization_id\`) REFERENCES \`organizations\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`instrument_ranges\` ADD CONSTRAINT \`FK_instrument_ranges_instrument\` FOREIGN KEY (\`instrument_id\`) REFERENCES \`instruments\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`jobs\` ADD CONSTRAINT \`FK_jobs_instrument\` FOREIGN KEY (\`instrument_id\`) REFERENCES \`instruments\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`jobs\` ADD CONSTRAINT \`FK_jobs_organization\` FOREIGN KEY (\`organization_id\`) REFERENCES \`organizations\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`jobs\` ADD CONSTRAINT \`FK_jobs_technician\` FOREIGN KEY (\`technician_id\`) REFERENCES \`users\`(\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`runs\` ADD CONSTRAINT \`FK_runs_job\` FOREIGN KEY (\`job_id\`) REFERENCES \`jobs\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`runs\` ADD CONSTRAINT \`FK_runs_range\` FOREIGN KEY (\`range_id\`) REFERENCES \`instrument_ranges\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`runs\` ADD CONSTRAINT \`FK_runs_bench\` FOREIGN KEY (\`bench_id\`) REFERENCES \`benches\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`runs\` ADD CONSTRAINT \`FK_runs_standard\` FOREIGN KEY (\`standard_id\`) REFERENCES \`standards\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`runs\` ADD CONSTRAINT \`FK_runs_created_by\` FOREIGN KEY (\`created_by\`) REFERENCES \`users\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`readings\` ADD CONSTRAINT \`FK_readings_run\` FOREIGN KEY (\`run_id\`) REFERENCES \`runs\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`reading_exclusions\` ADD CONSTRAINT \`FK_reading_exclusions_reading\` FOREIGN KEY (\`reading_id\`) REFERENCES \`readings\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );

    // Readings and their exclusions are a record: the database itself refuses to change or remove them.
    for (const table of ['readings', 'reading_exclusions']) {
      for (const action of ['UPDATE', 'DELETE']) {
        await queryRunner.query(
          `CREATE TRIGGER \`TRG_${table}_no_${action.toLowerCase()}\` BEFORE ${action} ON \`${table}\` FOR EACH ROW ` +
            `SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = '${table} are never changed or removed'`,
        );
      }
    }
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['readings', 'reading_exclusions']) {
      for (const action of ['update', 'delete']) await queryRunner.query(`DROP TRIGGER IF EXISTS \`TRG_${table}_no_${action}\``);
    }
    await queryRunner.query(`ALTER TABLE \`reading_exclusions\` DROP FOREIGN KEY \`FK_reading_exclusions_reading\``);
    await queryRunner.query(`ALTER TABLE \`readings\` DROP FOREIGN KEY \`FK_readings_run\``);
    await queryRunner.query(`ALTER TABLE \`runs\` DROP FOREIGN KEY \`FK_runs_created_by\``);
    await queryRunner.query(`ALTER TABLE \`runs\` DROP FOREIGN KEY \`FK_runs_standard\``);
    await queryRunner.query(`ALTER TABLE \`runs\` DROP FOREIGN KEY \`FK_runs_bench\``);
    await queryRunner.query(`ALTER TABLE \`runs\` DROP FOREIGN KEY \`FK_runs_range\``);
    await queryRunner.query(`ALTER TABLE \`runs\` DROP FOREIGN KEY \`FK_runs_job\``);
    await queryRunner.query(`ALTER TABLE \`jobs\` DROP FOREIGN KEY \`FK_jobs_technician\``);
    await queryRunner.query(`ALTER TABLE \`jobs\` DROP FOREIGN KEY \`FK_jobs_organization\``);
    await queryRunner.query(`ALTER TABLE \`jobs\` DROP FOREIGN KEY \`FK_jobs_instrument\``);
    await queryRunner.query(`ALTER TABLE \`instrument_ranges\` DROP FOREIGN KEY \`FK_instrument_ranges_instrument\``);
    await queryRunner.query(`ALTER TABLE \`instruments\` DROP FOREIGN KEY \`FK_instruments_organization\``);
    await queryRunner.query(`ALTER TABLE \`benches\` DROP FOREIGN KEY \`FK_benches_default_standard\``);
    await queryRunner.query(`DROP INDEX \`IDX_reading_exclusions_run\` ON \`reading_exclusions\``);
    await queryRunner.query(`DROP TABLE \`reading_exclusions\``);
    await queryRunner.query(`DROP INDEX \`UQ_readings_run_seq\` ON \`readings\``);
    await queryRunner.query(`DROP TABLE \`readings\``);
    await queryRunner.query(`DROP INDEX \`IDX_runs_job\` ON \`runs\``);
    await queryRunner.query(`DROP INDEX \`IDX_runs_bench_status\` ON \`runs\``);
    await queryRunner.query(`DROP TABLE \`runs\``);
    await queryRunner.query(`DROP INDEX \`IDX_jobs_organization_status\` ON \`jobs\``);
    await queryRunner.query(`DROP INDEX \`UQ_jobs_number\` ON \`jobs\``);
    await queryRunner.query(`DROP TABLE \`jobs\``);
    await queryRunner.query(`DROP INDEX \`UQ_instrument_ranges_position\` ON \`instrument_ranges\``);
    await queryRunner.query(`DROP TABLE \`instrument_ranges\``);
    await queryRunner.query(`DROP INDEX \`IDX_instruments_organization\` ON \`instruments\``);
    await queryRunner.query(`DROP INDEX \`UQ_instruments_make_model_serial\` ON \`instruments\``);
    await queryRunner.query(`DROP INDEX \`IDX_instruments_next_due\` ON \`instruments\``);
    await queryRunner.query(`DROP TABLE \`instruments\``);
    await queryRunner.query(`DROP INDEX \`UQ_benches_token_hash\` ON \`benches\``);
    await queryRunner.query(`DROP INDEX \`UQ_benches_name\` ON \`benches\``);
    await queryRunner.query(`DROP TABLE \`benches\``);
    await queryRunner.query(`DROP INDEX \`UQ_standards_name\` ON \`standards\``);
    await queryRunner.query(`DROP TABLE \`standards\``);
  }
}
