// Kilocycle's lint (issue #15): typescript-eslint's recommended set (without type information, so a run
// stays quick on two cores), the React hooks rules for the front end, the import boundaries of the tree
// (import-x/no-restricted-paths, zones written below from the folders on disk) and the table owners
// (kilocycle/table-owner in eslint-rules/, reading @Entity('table') from backend/src/*/*.entity.ts).
// Run: `npm run lint` (eslint with --max-warnings 0, then prettier --check).
import { readdirSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import js from '@eslint/js';
import importX, { createNodeResolver } from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';
import kilocycle from './eslint-rules/index.mjs';

const ROOT = dirname(fileURLToPath(import.meta.url));
const BACKEND_SRC = join(ROOT, 'backend/src');
const FEATURES = join(ROOT, 'frontend/src/features');
const foldersIn = (dir) => readdirSync(dir).filter((name) => statSync(join(dir, name)).isDirectory());

// ---- import boundaries ----------------------------------------------------------------------------
// Backend: the composition roots (app.module.ts, main.ts, cli.ts, setup-app.ts at src/, database/, seed/)
// may import anything; `shared/` is for everyone. A module folder imports another module only through
// that module's public files (conventions of #15), and never from seed/ or database/entities.ts.
const BACKEND_ROOT_FOLDERS = new Set(['database', 'seed', 'shared']);
const PUBLIC_FILES = ['module', 'service', 'reader', 'writer', 'entity', 'dto', 'guard', 'decorator', 'exception'];
const publicGlobs = PUBLIC_FILES.map((kind) => `${BACKEND_SRC}/**/*.${kind}.ts`);
const backendModules = foldersIn(BACKEND_SRC).filter((name) => !BACKEND_ROOT_FOLDERS.has(name));
const backendZones = backendModules.flatMap((name) => [
  {
    target: `${BACKEND_SRC}/${name}`,
    from: `${BACKEND_SRC}/!(${name}|${[...BACKEND_ROOT_FOLDERS].join('|')})/**`,
    except: publicGlobs,
    message: `${name}/ may import another module only through its public files (*.${PUBLIC_FILES.join('.ts, *.')}.ts).`,
  },
  {
    target: `${BACKEND_SRC}/${name}`,
    from: [`${BACKEND_SRC}/seed`, `${BACKEND_SRC}/database/entities.ts`],
    message: 'seed/ and database/entities.ts are composition roots: only the roots import them.',
  },
]);

// Front end: a feature never imports another feature; shared code lives in components/, lib/, hooks/, utils/.
const featureZones = foldersIn(FEATURES).map((name) => ({
  target: `${FEATURES}/${name}`,
  from: FEATURES,
  except: [`./${name}`],
  message: `features/${name} must not import another feature: move what both need to components/, lib/, hooks/ or utils/.`,
}));

// common: pure code, imports nothing of the app.
const commonZones = [
  {
    target: `${ROOT}/common`,
    from: [`${ROOT}/backend`, `${ROOT}/frontend`],
    message: 'common imports nothing of the app (no backend or frontend code).',
  },
];

// Node's ESM needs `.js` on relative imports; the files on disk are `.ts`.
const resolverOptions = {
  extensions: ['.ts', '.tsx', '.mjs', '.js', '.cjs', '.json'],
  extensionAlias: { '.js': ['.ts', '.tsx', '.js'] },
};

export default tseslint.config(
  {
    ignores: ['**/dist/**', '**/node_modules/**', 'var/**', 'fixtures/**', 'frontend/public/**', '**/coverage/**', '**/*.d.ts'],
  },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    linterOptions: { reportUnusedDisableDirectives: 'error' },
    languageOptions: { ecmaVersion: 'latest', sourceType: 'module' },
    plugins: { 'import-x': importX, kilocycle },
    settings: {
      'import-x/resolver-next': [createNodeResolver(resolverOptions)],
    },
    rules: {
      // The house style: unused names start with _ when they must stay (callbacks, destructuring).
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', ignoreRestSiblings: true },
      ],
      // The single-line text rules (common/src/text, attachments' names, their tests) match control characters on purpose.
      'no-control-regex': 'off',
      'import-x/no-restricted-paths': ['error', { basePath: ROOT, zones: [...backendZones, ...featureZones, ...commonZones] }],
    },
  },
  {
    // Node code: backend, scripts, configs, bin helpers, browser tests' runner side.
    files: ['backend/**', 'bin/**', 'common/scripts/**', '*.mjs', 'eslint-rules/**', '**/*.config.{ts,mjs,js,cjs}'],
    languageOptions: { globals: { ...globals.node } },
  },
  {
    files: ['eslint-rules/**/*.test.mjs'],
    languageOptions: { globals: { ...globals.jest } },
  },
  {
    files: ['**/*.cjs'],
    languageOptions: { sourceType: 'commonjs', globals: { ...globals.node } },
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  {
    files: ['backend/src/**/*.ts'],
    plugins: { kilocycle },
    rules: {
      'kilocycle/table-owner': 'error',
      // NestJS: injection-only constructors and marker classes (`export class XModule {}`) are the framework's shape.
      '@typescript-eslint/no-extraneous-class': 'off',
    },
  },
  {
    files: ['frontend/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    languageOptions: { globals: { ...globals.browser } },
    settings: {
      'import-x/resolver-next': [
        createNodeResolver({
          ...resolverOptions,
          alias: {
            '@': [join(ROOT, 'frontend/src')],
          },
        }),
      ],
    },
    // The two classic hooks rules. The plugin's React-Compiler rules (static-components, set-state-in-effect, …)
    // compile every component and took about 39 s of a 55 s run on this 2-core machine, so they stay off.
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'error' },
  },
  {
    files: ['frontend/e2e/**'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
  },
  {
    // common: no framework, no I/O, no clock (DEVELOPERS.md); its tests and bench script may use Node.
    files: ['common/src/**/*.ts'],
    ignores: ['common/src/**/__tests__/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['node:*', 'fs', 'path', 'os', 'crypto', 'http', 'https', 'child_process'],
              message: 'common has no I/O: keep Node code in the backend.',
            },
            { group: ['react', 'react-dom', '@mui/*', '@nestjs/*', 'typeorm', 'socket.io*'], message: 'common has no framework.' },
          ],
        },
      ],
      'no-restricted-globals': [
        'error',
        { name: 'window', message: 'common runs on both sides: no DOM.' },
        { name: 'document', message: 'common runs on both sides: no DOM.' },
        { name: 'localStorage', message: 'common runs on both sides: no DOM.' },
        { name: 'process', message: 'common reads no environment: the caller passes values in.' },
        { name: 'Buffer', message: 'common runs on both sides: use Uint8Array.' },
      ],
    },
  },
);
