import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A per-user session version, carried in every JWT: sign-in writes the current value into the token and
 * each request compares it, so raising it (deactivation, role or password change) ends every session of
 * that user at once. Tokens issued before this column existed carry no version and stop working.
 */
export class AddUserTokenVersion1764820000000 implements MigrationInterface {
  name = 'AddUserTokenVersion1764820000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `users` ADD `token_version` int NOT NULL DEFAULT 0');
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `users` DROP COLUMN `token_version`');
  }
}
