// Lint rules, and the import boundaries that keep the layers apart (README, "Architecture"):
// shared/ depends on nothing of ours; the server never imports the client or scripts/; the client
// never imports the server; server modules depend one way (MODULES, bottom up); the editor's core
// imports neither React, Konva nor the API layer; a feature of the client imports no other feature
// but auth.
import js from '@eslint/js';
import importX from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import reactHooks from 'eslint-plugin-react-hooks';
import tseslint from 'typescript-eslint';

const FEATURES = ['account', 'auth', 'dev', 'editor', 'library', 'orders', 'sheets', 'shop', 'team'];
/** Server modules from the bottom up: each may import those before it, never one after it. */
const MODULES = [
  'accounts',
  'auth',
  'teams',
  'collections',
  'art',
  'outlines',
  'sheets',
  'shop',
  'exports',
  'arrange',
  'orders',
  'health',
  'dev',
];

/** Zones for import-x/no-restricted-paths: files under `target` may not import from `from`. */
const zones = [
  {
    target: './shared',
    from: ['./server', './src', './scripts', './tests'],
    message: 'shared/ depends on nothing of ours: move what both sides need into shared/.',
  },
  {
    target: './server',
    from: ['./src', './scripts'],
    message: 'The server imports neither the client nor scripts/: move what it needs into server/ or shared/.',
  },
  { target: './src', from: ['./server', './scripts'], message: 'The client never imports the server: share it through shared/.' },
  {
    target: './src/features/editor/core',
    from: ['./src/features/editor/api', './src/features/editor/ui', './src/features/editor/render', './src/lib'],
    message: 'The editor core imports neither the API layer nor the views.',
  },
  ...MODULES.slice(0, -1).map((m, k) => ({
    target: `./server/modules/${m}`,
    from: MODULES.slice(k + 1).map((n) => `./server/modules/${n}`),
    message: `Server modules depend one way (${MODULES.join(' → ')}): a module imports only those before it; hand it what it needs from a later one (see app.ts).`,
  })),
  ...FEATURES.filter((f) => f !== 'auth').map((f) => ({
    target: `./src/features/${f}`,
    from: FEATURES.filter((g) => g !== f && g !== 'auth').map((g) => `./src/features/${g}`),
    message: 'Features import no other feature but auth: move what both need to src/components, src/hooks, src/lib or shared/.',
  })),
];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.data/**', 'tests/output/**', '**/*.tmp.*'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx,js,mjs}'],
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'module',
      globals: {
        console: 'readonly',
        process: 'readonly',
        URL: 'readonly',
        setTimeout: 'readonly',
        clearTimeout: 'readonly',
        setInterval: 'readonly',
        clearInterval: 'readonly',
        performance: 'readonly',
        Buffer: 'readonly',
      },
    },
    plugins: { 'import-x': importX },
    rules: {
      'import-x/no-restricted-paths': ['error', { zones }],
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' },
      ],
      '@typescript-eslint/consistent-type-imports': ['error', { prefer: 'type-imports', fixStyle: 'separate-type-imports' }],
      // A file longer than a screenful or five does more than one thing: split it by what it does.
      'max-lines': ['error', { max: 300 }],
    },
    // The TypeScript resolver reads tsconfig's paths (@/, @shared/), so the boundary rules see where an alias leads.
    settings: { 'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json' })] },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    // The two rules of hooks; the compiler-oriented rules of the plugin's newer presets are left out.
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'error' },
  },
  {
    files: ['src/features/editor/core/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['react', 'react-dom', 'react-dom/*', 'konva', 'konva/*', 'react-konva', '@tanstack/*'],
              message: 'The editor core is plain TypeScript: no React, Konva or TanStack Query here.',
            },
          ],
        },
      ],
    },
  },
);
