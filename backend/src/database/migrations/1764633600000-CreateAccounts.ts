import type { MigrationInterface, QueryRunner } from 'typeorm';

export class CreateAccounts1764633600000 implements MigrationInterface {
  name = 'CreateAccounts1764633600000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE \`organizations\` (
      \`id\` int NOT NULL AUTO_INCREMENT,
      \`name\` varchar(200) NOT NULL,
      \`kind\` varchar(16) NOT NULL,
      \`contact_email\` varchar(254) NULL,
      \`active\` tinyint NOT NULL DEFAULT 1,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      UNIQUE INDEX \`UQ_organizations_name\` (\`name\`),
      PRIMARY KEY (\`id\`)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`CREATE TABLE \`users\` (
      \`id\` int NOT NULL AUTO_INCREMENT,
      \`email\` varchar(254) NOT NULL,
      \`name\` varchar(200) NOT NULL,
      \`role\` varchar(16) NOT NULL,
      \`organization_id\` int NOT NULL,
      \`password_hash\` varchar(100) NOT NULL,
      \`active\` tinyint NOT NULL DEFAULT 1,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      UNIQUE INDEX \`UQ_users_email\` (\`email\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_users_organization\` FOREIGN KEY (\`organization_id\`) REFERENCES \`organizations\` (\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`CREATE TABLE \`audit_events\` (
      \`id\` bigint NOT NULL AUTO_INCREMENT,
      \`actor_id\` int NULL,
      \`at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`entity\` varchar(40) NOT NULL,
      \`entity_id\` varchar(40) NOT NULL,
      \`action\` varchar(40) NOT NULL,
      \`changes\` json NULL,
      INDEX \`IDX_audit_events_entity\` (\`entity\`, \`entity_id\`),
      PRIMARY KEY (\`id\`)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`CREATE TABLE \`revoked_tokens\` (
      \`jti\` varchar(36) NOT NULL,
      \`expires_at\` datetime NOT NULL,
      PRIMARY KEY (\`jti\`)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE `revoked_tokens`');
    await queryRunner.query('DROP TABLE `audit_events`');
    await queryRunner.query('DROP TABLE `users`');
    await queryRunner.query('DROP TABLE `organizations`');
  }
}
