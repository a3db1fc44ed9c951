import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Lets a run's readings be paged in frequency or time order without sorting the whole run. */
export class AddReadingSortIndexes1764660000000 implements MigrationInterface {
  name = 'AddReadingSortIndexes1764660000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('CREATE INDEX `IDX_readings_run_frequency` ON `readings` (`run_id`, `frequency_hz`)');
    await queryRunner.query('CREATE INDEX `IDX_readings_run_t` ON `readings` (`run_id`, `t_s`)');
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP INDEX `IDX_readings_run_t` ON `readings`');
    await queryRunner.query('DROP INDEX `IDX_readings_run_frequency` ON `readings`');
  }
}
