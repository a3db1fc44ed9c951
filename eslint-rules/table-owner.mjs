// kilocycle/table-owner: a backend module queries only the tables it owns (issue #15, "one owner per table").
//
// Hand-written because no kept ESLint plugin knows our table owners: the table → folder map is read at load
// from the `@Entity('table')` decorators in backend/src/<folder>/*.entity.ts, the one source of truth
// (the conventions' owner list is those files). It reports, in backend/src outside database/migrations:
//   - SQL in a string or template literal passed to `.query(` (or held in a `const` that is) naming a
//     table of another folder (FROM, JOIN, INTO, UPDATE, TABLE); also a literal that starts like a
//     statement (SELECT, INSERT, UPDATE, DELETE, WITH, REPLACE) given as first argument to any other call,
//     so a local alias such as `const q = (sql) => manager.query(sql)` does not hide the table;
//   - query-builder `.from(` / `.innerJoin(` / `.leftJoin(` (…AndSelect, …AndMap…) / `.into(` given another
//     folder's table name or entity class;
//   - `@InjectRepository(X)`, `TypeOrmModule.forFeature([X])`, `getRepository(X)`, `createQueryBuilder(X`
//     and EntityManager calls `manager.find*(X`, `count(X`, `insert(X`, `update(X`, `delete(X`, … where X
//     is an entity of another folder.
// Entity classes of another module stay allowed as types and in relation decorators (conventions).
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const REPO_ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');

/** Reads `@Entity('table')` / `@Entity({ name: 'table' })` and the class after it from one file's text. */
export function entitiesInSource(text) {
  const found = [];
  const re = /@Entity\(\s*(?:['"]([\w$]+)['"]|\{[^}]*?name:\s*['"]([\w$]+)['"][^}]*\})[^)]*\)[\s\S]*?\bclass\s+([\w$]+)/g;
  for (let m = re.exec(text); m; m = re.exec(text)) found.push({ table: m[1] ?? m[2], entity: m[3] });
  return found;
}

/** The owners map of a backend: tables and entity classes → the folder under src/ that declares them. */
export function loadOwners(srcDir) {
  const tables = {};
  const entities = {};
  for (const folder of readdirSync(srcDir)) {
    const dir = join(srcDir, folder);
    if (!statSync(dir).isDirectory()) continue;
    for (const file of readdirSync(dir)) {
      if (!file.endsWith('.entity.ts')) continue;
      for (const { table, entity } of entitiesInSource(readFileSync(join(dir, file), 'utf8'))) {
        tables[table] = folder;
        entities[entity] = folder;
      }
    }
  }
  return { tables, entities };
}

let cachedOwners;
function defaultOwners() {
  cachedOwners ??= loadOwners(join(REPO_ROOT, 'backend', 'src'));
  return cachedOwners;
}

// The word before a table name in SQL. `DELETE FROM x` and `INSERT IGNORE INTO x` are covered by FROM/INTO.
// A literal that reads as a whole statement, whatever the call it is handed to.
const STATEMENT_START = /^\s*(?:SELECT|INSERT|UPDATE|DELETE|WITH|REPLACE)\s/i;

const SQL_TABLE = /\b(?:FROM|JOIN|INTO|UPDATE|TABLE)\s+`?([A-Za-z_][\w$]*)`?/gi;

/** Table names written in one piece of SQL (template expressions are left out: they are not known here). */
export function tablesInSql(sql) {
  const names = new Set();
  for (const m of sql.matchAll(SQL_TABLE)) names.add(m[1].toLowerCase());
  return [...names];
}

const BUILDER_METHODS = new Set([
  'from',
  'into',
  'innerJoin',
  'leftJoin',
  'innerJoinAndSelect',
  'leftJoinAndSelect',
  'innerJoinAndMapOne',
  'innerJoinAndMapMany',
  'leftJoinAndMapOne',
  'leftJoinAndMapMany',
]);
// EntityManager / DataSource methods whose first argument is the entity queried.
const MANAGER_METHODS = new Set([
  'getRepository',
  'createQueryBuilder',
  'find',
  'findBy',
  'findOne',
  'findOneBy',
  'findOneOrFail',
  'findOneByOrFail',
  'findAndCount',
  'findAndCountBy',
  'count',
  'countBy',
  'exists',
  'existsBy',
  'sum',
  'average',
  'minimum',
  'maximum',
  'insert',
  'update',
  'upsert',
  'delete',
  'softDelete',
  'restore',
  'increment',
  'decrement',
  'clear',
]);

/** The folder under backend/src holding this file, '' for the root files, null outside backend/src. */
function folderOf(filename, srcDir) {
  const rel = relative(srcDir, filename);
  if (rel.startsWith('..') || rel === filename) return null;
  const parts = rel.split(sep);
  return parts.length > 1 ? parts[0] : '';
}

function literalText(node) {
  if (!node) return null;
  if (node.type === 'Literal' && typeof node.value === 'string') return node.value;
  if (node.type === 'TemplateLiteral') return node.quasis.map((q) => q.value.cooked ?? q.value.raw).join(' ');
  return null;
}

function calleeName(callee) {
  if (callee.type === 'Identifier') return callee.name;
  if (callee.type === 'MemberExpression' && !callee.computed && callee.property.type === 'Identifier') return callee.property.name;
  return null;
}

export default {
  meta: {
    type: 'problem',
    docs: { description: 'Only the module that owns a table queries it (raw SQL, query builder, repository, EntityManager)' },
    schema: [
      {
        type: 'object',
        properties: {
          // For the rule's own tests: a map instead of the one read from backend/src.
          tables: { type: 'object', additionalProperties: { type: 'string' } },
          entities: { type: 'object', additionalProperties: { type: 'string' } },
          srcDir: { type: 'string' },
        },
        additionalProperties: false,
      },
    ],
    messages: {
      table: "table '{{table}}' belongs to {{owner}}/: call {{owner}}'s exported service or reader instead of querying it from {{here}}",
      entity: "entity {{entity}} (table of {{owner}}/) is queried from {{here}}: call {{owner}}'s exported service or reader instead",
    },
  },
  create(context) {
    const options = context.options[0] ?? {};
    const srcDir = options.srcDir ?? join(REPO_ROOT, 'backend', 'src');
    const here = folderOf(context.physicalFilename ?? context.filename, srcDir);
    if (here === null || here === 'database' || here === 'seed') {
      // Outside backend/src nothing is checked; database/ (migrations, entities.ts) and seed/ are the
      // composition roots, allowed every table. Modules' own `*.demo.ts` files are checked like the rest.
      return {};
    }
    const owners = options.tables || options.entities ? { tables: options.tables ?? {}, entities: options.entities ?? {} } : defaultOwners();
    const hereLabel = here === '' ? 'backend/src' : `${here}/`;

    function checkTable(node, table) {
      const owner = owners.tables[table];
      if (owner && owner !== here) context.report({ node, messageId: 'table', data: { table, owner, here: hereLabel } });
    }
    function checkEntity(node) {
      if (node?.type !== 'Identifier') return;
      const owner = owners.entities[node.name];
      if (owner && owner !== here) context.report({ node, messageId: 'entity', data: { entity: node.name, owner, here: hereLabel } });
    }
    function checkSql(node) {
      let text = literalText(node);
      if (text === null && node?.type === 'Identifier') {
        // `const sql = '…'; manager.query(sql)`: follow a const with a literal value in scope.
        let scope = context.sourceCode.getScope(node);
        while (scope && text === null) {
          const variable = scope.set.get(node.name);
          const def = variable?.defs[0];
          if (def) {
            if (def.type === 'Variable' && def.parent.kind === 'const') text = literalText(def.node.init);
            break;
          }
          scope = scope.upper;
        }
      }
      if (text === null) return;
      for (const table of tablesInSql(text)) checkTable(node, table);
    }

    return {
      CallExpression(node) {
        const name = calleeName(node.callee);
        const [first] = node.arguments;
        if (name === 'query' && node.callee.type === 'MemberExpression') {
          checkSql(first);
        } else if (STATEMENT_START.test(literalText(first) ?? '')) {
          checkSql(first);
        } else if (!name) {
          return;
        } else if (BUILDER_METHODS.has(name) && node.callee.type === 'MemberExpression') {
          const text = literalText(first);
          // 'alias.relation' joins follow an entity's relation decorators: allowed.
          if (text !== null && /^[A-Za-z_][\w$]*$/.test(text)) checkTable(first, text);
          else checkEntity(first);
        } else if (name === 'InjectRepository') {
          checkEntity(first);
        } else if (name === 'forFeature' && first?.type === 'ArrayExpression') {
          for (const element of first.elements) checkEntity(element);
        } else if (MANAGER_METHODS.has(name)) {
          checkEntity(first);
        }
      },
    };
  },
};
