// ESLint flat config: typescript-eslint's recommended rules, React's hook rules for app/, and the
// import boundaries between shared/, server/, app/ and the features inside app/ (DEVELOPERS.md,
// "Lint"). Run with `npm run lint` (also the second step of `npm test`).
import { readdirSync } from 'node:fs';
import { builtinModules } from 'node:module';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

const FEATURES = readdirSync(new URL('./app/features/', import.meta.url), { withFileTypes: true })
  .filter((e) => e.isDirectory())
  .map((e) => e.name);

const escape = (s) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

// shared/ is pure: no I/O, no server or browser frameworks, nothing from the other trees.
const sharedRules = {
  paths: builtinModules
    .filter((m) => !m.startsWith('_'))
    .map((name) => ({ name, message: 'shared/ is pure: no Node.js modules; do the I/O in server/.' })),
  patterns: [
    { regex: '^node:', message: 'shared/ is pure: no Node.js modules; do the I/O in server/.' },
    {
      regex: '^(express|knex|pg|better-sqlite3|react|react-dom)(/|$)',
      message: 'shared/ is pure: no server, database or React packages.',
    },
    { regex: '^(\\.\\./)+(server|app|tests)(/|$)', message: 'shared/ imports only shared/ and pure packages.' },
  ],
};

const appPatterns = [{ regex: '^(\\.\\./)+server(/|$)', message: 'app/ never imports server/; share code through shared/.' }];

// A feature reaches another feature only through its public entry: `app/features/<b>/api.ts`
// (the queries, mutations and types it offers) or an `index.ts` if it grows one. Components and
// helpers inside a feature stay private to it; screens that combine features live in app/routes/.
// The regexes are written per depth of the importing file inside its feature folder, because an
// import string is matched as written (`../x/…` from the feature root, `../../x/…` one folder down).
function featurePatterns(feature, depth) {
  const other = `(?!${escape(feature)}/)[^./][^/]*`;
  const notEntry = '/(?!(api|index)(\\.tsx?)?$)';
  const message = `import another feature only through its api.ts or index.ts (app/features/<name>/api).`;
  return [
    { regex: `^(\\.\\./){${depth + 1}}${other}${notEntry}`, message },
    { regex: `^(\\.\\./){${depth + 2}}features/${other}${notEntry}`, message },
  ];
}

const featureBlocks = FEATURES.flatMap((feature) =>
  [0, 1, 2, 3].map((depth) => ({
    files: [`app/features/${feature}/${'*/'.repeat(depth)}*.{ts,tsx}`],
    rules: {
      'no-restricted-imports': ['error', { patterns: [...appPatterns, ...featurePatterns(feature, depth)] }],
    },
  })),
);

export default tseslint.config(
  {
    ignores: ['dist/', 'node_modules/', 'coverage/', 'data/', 'tmp/', '.vite/', 'test-results/', 'playwright-report/'],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    linterOptions: { reportUnusedDisableDirectives: 'error' },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', ignoreRestSiblings: true },
      ],
      // V8's linear-time engine flag (node --enable-experimental-regexp-engine), probed on purpose
      // by shared/naming/linear-regex.ts.
      'no-invalid-regexp': ['error', { allowConstructorFlags: ['l'] }],
      // The DXF, XLSX and text-limit readers find and refuse control characters in uploads: regexes
      // over \x00-\x1f are their job, which is exactly what this rule forbids.
      'no-control-regex': 'off',
    },
  },
  {
    files: ['**/*.{js,mjs,cjs}'],
    languageOptions: { globals: { URL: 'readonly', console: 'readonly', process: 'readonly' } },
  },
  {
    files: ['app/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'no-restricted-imports': ['error', { patterns: appPatterns }],
    },
  },
  ...featureBlocks,
  {
    files: ['server/**/*.{ts,tsx,mjs}'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ regex: '^(\\.\\./)+app(/|$)', message: 'server/ never imports app/; share code through shared/.' }] },
      ],
    },
  },
  {
    files: ['shared/**/*.{ts,tsx}'],
    rules: { 'no-restricted-imports': ['error', sharedRules] },
  },
);
