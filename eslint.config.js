// Lint rules, including the import directions the architecture depends on:
// features never import each other; shared/ imports nothing from client/, server/ or Node.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

/** A tiny local rule: a file in client/src/features/<a>/ may not import client/src/features/<b>/. */
const boundaries = {
  rules: {
    'no-cross-feature': {
      meta: { type: 'problem', messages: { cross: 'Feature "{{from}}" must not import feature "{{to}}": move the shared part to components/ or lib/.' } },
      create(context) {
        const file = context.filename.replaceAll('\\', '/');
        const own = /client\/src\/features\/([^/]+)\//.exec(file)?.[1];
        if (!own) return {};
        const check = (node) => {
          const src = node.source?.value;
          if (typeof src !== 'string') return;
          const m = /(?:@client\/features\/|\.\.\/(?:\.\.\/)*features\/)([^/]+)/.exec(src);
          if (m && m[1] !== own) context.report({ node, messageId: 'cross', data: { from: own, to: m[1] } });
        };
        return { ImportDeclaration: check, ImportExpression: check, ExportNamedDeclaration: check, ExportAllDeclaration: check };
      },
    },
  },
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
        { patterns: [{ group: ['node:*', 'fs', 'path', 'os', 'crypto', 'express', 'knex', 'pg', 'react', 'react-dom', '@client/*', '**/server/**', '**/client/**'], message: 'shared/ is pure: no Node, DOM, server or client imports.' }] },
      ],
    },
  },
);
