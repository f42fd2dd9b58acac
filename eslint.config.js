// Lint rules, including the import directions the architecture depends on:
// features never import each other; shared/ imports nothing from client/, server/ or Node.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

/**
 * Building-block features: domain views and state that several screens show (results tables, the 3D model,
 * the reviewer's notes on the device, the sync status). Screen features (workspace, review, auth, members,
 * dev-mail, status) may import them; a building block imports no feature at all, and screens never import
 * each other. So the graph stays two layers deep and has no circles. See DEVELOPERS.md, "Client rooms".
 */
const BUILDING_BLOCKS = new Set(['results', 'model3d', 'review-notes', 'sync', 'flooding', 'survey-inputs']);

/**
 * A tiny local rule for client/src/:
 * - a file in features/<a>/ may import features/<b>/ only when <a> is a screen and <b> a building block;
 * - components/, lib/, offline/ and config/ (shared by every feature) import no feature.
 */
const boundaries = {
  rules: {
    'no-cross-feature': {
      meta: {
        type: 'problem',
        messages: {
          cross: 'Feature "{{from}}" must not import feature "{{to}}": only screen features import building blocks ({{blocks}}); move the shared part to components/ or lib/.',
          shared: 'Shared client code ({{from}}/) must not import feature "{{to}}": move it into that feature, or the shared part down here.',
        },
      },
      create(context) {
        const file = context.filename.replaceAll('\\', '/');
        const own = /client\/src\/features\/([^/]+)\//.exec(file)?.[1];
        const sharedDir = /client\/src\/(components|lib|offline|config)\//.exec(file)?.[1];
        if (!own && !sharedDir) return {};
        const check = (node) => {
          const src = node.source?.value;
          if (typeof src !== 'string') return;
          const m = /(?:@client\/features\/|\.\.\/(?:\.\.\/)*features\/)([^/]+)/.exec(src);
          if (!m) return;
          const to = m[1];
          if (sharedDir) {
            context.report({ node, messageId: 'shared', data: { from: sharedDir, to } });
            return;
          }
          if (to === own) return;
          if (!BUILDING_BLOCKS.has(own) && BUILDING_BLOCKS.has(to)) return;
          context.report({ node, messageId: 'cross', data: { from: own, to, blocks: [...BUILDING_BLOCKS].join(', ') } });
        };
        return { ImportDeclaration: check, ImportExpression: check, ExportNamedDeclaration: check, ExportAllDeclaration: check };
      },
    },
  },
};

const SHARED_IS_PURE = {
  group: ['node:*', 'fs', 'path', 'os', 'crypto', 'express', 'knex', 'pg', 'react', 'react-dom', '@client/*', '**/server/**', '**/client/**'],
  message: 'shared/ is pure: no Node, DOM, server or client imports.',
};

/** Outside shared/engine/ the engine is reached through its public surface, shared/engine/index.ts, only. */
const ENGINE_SURFACE = {
  group: ['@shared/engine/*', '**/shared/engine/*', '../engine/*', '../../engine/*'],
  message: 'Import the engine from @shared/engine (shared/engine/index.ts), its public surface.',
};

export default tseslint.config(
  { ignores: ['node_modules', 'dist', '.data', '.tmp', 'test-results', 'shared/schemas/*.json'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  {
    files: ['client/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks, brineline: boundaries },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
      'brineline/no-cross-feature': 'error',
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            SHARED_IS_PURE,
            ENGINE_SURFACE,
          ],
        },
      ],
    },
  },
  {
    files: ['client/**/*.{ts,tsx}', 'server/**/*.ts', 'scripts/**/*.ts'],
    rules: { 'no-restricted-imports': ['error', { patterns: [ENGINE_SURFACE] }] },
  },
  // The engine's own files import each other directly.
  { files: ['shared/engine/**/*.ts'], rules: { 'no-restricted-imports': ['error', { patterns: [SHARED_IS_PURE] }] } },
);
