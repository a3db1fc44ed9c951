// Tests of kilocycle/table-owner with ESLint's RuleTester (run by `npm run lint:rules`, jest in ESM mode).
// The owners in the cases are the ones agreed in the conventions of issue #15 (readings owns readings,
// runs owns runs, budgets owns job_procedures, …), written here by hand, not read by the rule.
import { join } from 'node:path';
import { RuleTester } from 'eslint';
import tsParser from '@typescript-eslint/parser';
import rule, { entitiesInSource, loadOwners, tablesInSql } from './table-owner.mjs';

const SRC = '/repo/backend/src';
const owners = {
  srcDir: SRC,
  tables: { readings: 'readings', reading_exclusions: 'readings', runs: 'runs', job_procedures: 'budgets', users: 'users' },
  entities: { Reading: 'readings', Run: 'runs', JobProcedure: 'budgets', User: 'users' },
};
const inFolder = (folder, file = 'thing.service.ts') => join(SRC, folder, file);

const tester = new RuleTester({ languageOptions: { parser: tsParser, ecmaVersion: 'latest', sourceType: 'module' } });

tester.run('table-owner', rule, {
  valid: [
    // The owner queries its own tables, every way.
    {
      filename: inFolder('readings'),
      options: [owners],
      code: "await this.dataSource.query('SELECT * FROM readings r JOIN reading_exclusions e ON e.reading_id = r.id');",
    },
    { filename: inFolder('runs'), options: [owners], code: 'await manager.query(`UPDATE runs SET ended_at = NOW() WHERE id = ?`, [id]);' },
    {
      filename: inFolder('runs'),
      options: [owners],
      code: 'class S { constructor(@InjectRepository(Run) private readonly runs: Repository<Run>) {} }',
    },
    { filename: inFolder('budgets'), options: [owners], code: "qb.from('job_procedures', 'jp').innerJoin(JobProcedure, 'x');" },
    // Another module's entity as a type or in a relation is allowed; relation joins ('alias.relation') too.
    {
      filename: inFolder('jobs', 'job.entity.ts'),
      options: [owners],
      code: 'class Job { @ManyToOne(() => User) technician: Relation<User>; }',
    },
    { filename: inFolder('jobs'), options: [owners], code: "repo.createQueryBuilder('j').leftJoinAndSelect('j.technician', 'u');" },
    // A table no module owns (health's SELECT 1, information_schema) is not reported.
    { filename: inFolder('health', 'health.controller.ts'), options: [owners], code: "await this.dataSource.query('SELECT 1');" },
    { filename: inFolder('jobs'), options: [owners], code: "await ds.query('SELECT table_name FROM information_schema.tables');" },
    // Migrations and the composition roots may touch every table; code outside backend/src is not checked.
    {
      filename: inFolder('database', 'migrations/1700000000000-Init.ts'),
      options: [owners],
      code: "await q.query('ALTER TABLE readings ADD x INT');",
    },
    { filename: inFolder('seed', 'demo-seed.ts'), options: [owners], code: 'await manager.find(User, {});' },
    { filename: '/repo/backend/test/runs/runs.e2e-spec.ts', options: [owners], code: "await ds.query('DELETE FROM runs');" },
    // Array.find with a callback is not an EntityManager call; a SQL string not given to .query is not SQL.
    { filename: inFolder('jobs'), options: [owners], code: "const r = list.find((x) => x.id === 1); const note = 'read from readings';" },
  ],
  invalid: [
    {
      // SQL handed to a local alias of manager.query, and to an immediately called helper.
      filename: inFolder('recall'),
      options: [owners],
      code: "const query = (sql, p) => manager.query(sql, p); await query('SELECT id FROM runs WHERE job_id = ?', [id]); await fetchRows(`DELETE FROM readings WHERE run_id = ?`);",
      errors: [
        { messageId: 'table', data: { table: 'runs', owner: 'runs', here: 'recall/' } },
        { messageId: 'table', data: { table: 'readings', owner: 'readings', here: 'recall/' } },
      ],
    },
    {
      filename: inFolder('budgets', 'job-results.ts'),
      options: [owners],
      code: "await manager.query('SELECT r.* FROM readings r LEFT JOIN reading_exclusions e ON e.reading_id = r.id WHERE r.run_id IN (?)', [ids]);",
      errors: [
        { messageId: 'table', data: { table: 'readings', owner: 'readings', here: 'budgets/' } },
        { messageId: 'table', data: { table: 'reading_exclusions', owner: 'readings', here: 'budgets/' } },
      ],
    },
    {
      // A template literal, and SQL kept in a const before the call.
      filename: inFolder('reviews'),
      options: [owners],
      code: 'const SQL = `UPDATE runs SET locked = 1 WHERE job_id = ${"?"}`; await this.ds.query(SQL, [jobId]);',
      errors: [{ messageId: 'table', data: { table: 'runs', owner: 'runs', here: 'reviews/' } }],
    },
    {
      filename: inFolder('readings', 'readings-writer.service.ts'),
      options: [owners],
      code: "await manager.query('INSERT IGNORE INTO readings (run_id) VALUES ?', [rows]); await manager.query('SELECT id FROM runs WHERE id = ? FOR UPDATE', [id]);",
      errors: [{ messageId: 'table', data: { table: 'runs', owner: 'runs', here: 'readings/' } }],
    },
    {
      filename: inFolder('ingest'),
      options: [owners],
      code: "ds.createQueryBuilder().select('jp.id').from('job_procedures', 'jp').innerJoin('runs', 'r', 'r.job_id = jp.job_id');",
      errors: [
        { messageId: 'table', data: { table: 'job_procedures', owner: 'budgets', here: 'ingest/' } },
        { messageId: 'table', data: { table: 'runs', owner: 'runs', here: 'ingest/' } },
      ],
    },
    {
      filename: inFolder('certificates'),
      options: [owners],
      code: "ds.createQueryBuilder(Run, 'r').leftJoin(JobProcedure, 'jp', 'jp.job_id = r.job_id');",
      errors: [
        { messageId: 'entity', data: { entity: 'Run', owner: 'runs', here: 'certificates/' } },
        { messageId: 'entity', data: { entity: 'JobProcedure', owner: 'budgets', here: 'certificates/' } },
      ],
    },
    {
      filename: inFolder('auth', 'auth.service.ts'),
      options: [owners],
      code: 'class A { constructor(@InjectRepository(User) private readonly users: Repository<User>) {} }',
      errors: [{ messageId: 'entity', data: { entity: 'User', owner: 'users', here: 'auth/' } }],
    },
    {
      filename: inFolder('auth', 'auth.module.ts'),
      options: [owners],
      code: 'const imports = [TypeOrmModule.forFeature([User])];',
      errors: [{ messageId: 'entity', data: { entity: 'User', owner: 'users', here: 'auth/' } }],
    },
    {
      filename: inFolder('jobs', 'jobs.demo.ts'),
      options: [owners],
      code: 'await manager.getRepository(Run).save(rows); await manager.findOneBy(Reading, { id }); await manager.count(JobProcedure);',
      errors: [
        { messageId: 'entity', data: { entity: 'Run', owner: 'runs', here: 'jobs/' } },
        { messageId: 'entity', data: { entity: 'Reading', owner: 'readings', here: 'jobs/' } },
        { messageId: 'entity', data: { entity: 'JobProcedure', owner: 'budgets', here: 'jobs/' } },
      ],
    },
    {
      // The root files of backend/src (cli.ts, main.ts) own no table either.
      filename: join(SRC, 'cli.ts'),
      options: [owners],
      code: "await ds.query('DELETE FROM users WHERE id = ?', [id]);",
      errors: [{ messageId: 'table', data: { table: 'users', owner: 'users', here: 'backend/src' } }],
    },
  ],
});

describe('the owners map', () => {
  it('reads both decorator forms and the class after each', () => {
    const text =
      "@Entity('counter_captures')\nexport class CounterCapture {}\n@Entity({ name: 'counter_capture_samples' })\n@Index(['a'])\nexport class CounterCaptureSample {}";
    expect(entitiesInSource(text)).toEqual([
      { table: 'counter_captures', entity: 'CounterCapture' },
      { table: 'counter_capture_samples', entity: 'CounterCaptureSample' },
    ]);
  });

  it('finds the tables a statement names, not its columns or literals', () => {
    expect(tablesInSql('SELECT COUNT(*) AS n FROM `jobs` j INNER JOIN runs r ON r.job_id = j.id WHERE j.number LIKE ?').sort()).toEqual(['jobs', 'runs']);
    expect(tablesInSql('DELETE FROM reading_exclusions WHERE id = ?')).toEqual(['reading_exclusions']);
    expect(tablesInSql('SELECT 1')).toEqual([]);
  });

  it('agrees with the table owners agreed for issue #15, read from the real entity files', () => {
    const { tables } = loadOwners(join(import.meta.dirname, '..', 'backend', 'src'));
    // A sample of the conventions' owner list (tables that no one plans to move).
    expect(tables).toMatchObject({
      readings: 'readings',
      reading_exclusions: 'readings',
      counter_capture_samples: 'ingest',
      job_procedures: 'budgets',
      settings: 'certificates',
      audit_events: 'audit',
    });
  });
});
