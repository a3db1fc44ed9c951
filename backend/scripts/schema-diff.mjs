// Prints the SQL that would bring the database (KC_DB_NAME) to the entities: the body of a new migration.
// Usage: npm run build -w backend && KC_DB_NAME=kilocycle_scratch node backend/scripts/schema-diff.mjs
import { createDataSource } from '../dist/database/create-data-source.js';

const ds = createDataSource();
await ds.initialize();
await ds.runMigrations();
const sql = await ds.driver.createSchemaBuilder().log();
for (const q of sql.upQueries) console.log(`UP   ${q.query}`);
for (const q of sql.downQueries.reverse()) console.log(`DOWN ${q.query}`);
await ds.destroy();
