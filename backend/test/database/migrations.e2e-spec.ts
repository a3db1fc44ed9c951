import { DataSource } from 'typeorm';
import { loadConfig } from '../../src/config/app-config.js';
import { ENTITIES } from '../../src/database/entities.js';
import { MIGRATIONS } from '../../src/database/migrations/index.js';
import { typeormOptions } from '../../src/database/typeorm-options.js';

describe('migrations (e2e, MariaDB)', () => {
  const name = `${loadConfig().db.name}_migrations`;
  let admin: DataSource;
  beforeAll(async () => {
    admin = new DataSource({ ...typeormOptions(loadConfig()), entities: [] });
    await admin.initialize();
    await admin.query(`DROP DATABASE IF EXISTS ${name}`);
    await admin.query(`CREATE DATABASE ${name} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  });
  afterAll(async () => {
    await admin.query(`DROP DATABASE IF EXISTS ${name}`);
    await admin.destroy();
  });

  it('should run every migration up on an empty database, match the entities, and run all the way down', async () => {
    const config = loadConfig();
    const ds = new DataSource({ ...typeormOptions({ ...config, db: { ...config.db, name } }), entities: ENTITIES });
    await ds.initialize();
    try {
      const ran = await ds.runMigrations({ transaction: 'each' });
      expect(ran.map((m) => m.name)).toEqual(MIGRATIONS.map((m) => new m().name));
      const tables = (await ds.query('SHOW TABLES')).map((r: Record<string, string>) => Object.values(r)[0]).sort();
      for (const table of ['organizations', 'users', 'audit_events', 'revoked_tokens', 'instruments', 'readings']) expect(tables).toContain(table);
      // The schema the migrations built is the one the entities describe (what migration:generate compares).
      const pending = await ds.driver.createSchemaBuilder().log();
      expect(pending.upQueries.map((q) => q.query)).toEqual([]);
      for (let i = 0; i < MIGRATIONS.length; i += 1) await ds.undoLastMigration({ transaction: 'each' });
      const left = (await ds.query('SHOW TABLES')).map((r: Record<string, string>) => Object.values(r)[0]);
      expect(left).toEqual(['kc_migrations']);
    } finally {
      await ds.destroy();
    }
  });
});
