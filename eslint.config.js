// Lint rules for the whole tree. Boundaries from the contributor guide:
// shared/ imports nothing from server/ or src/; the engine imports no HTTP or database code;
// the client never imports server code.
import js from '@eslint/js';
import globals from 'globals';
import reactHooks from 'eslint-plugin-react-hooks';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['dist/**', 'data/**', 'node_modules/**', 'coverage/**', 'tests/e2e/screenshots/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx}'],
    languageOptions: {
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
      globals: { ...globals.node, ...globals.browser },
    },
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-console': ['error', { allow: ['warn', 'error'] }],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'no-restricted-imports': ['error', { patterns: [{ group: ['@server/*', '**/server/**'], message: 'The client never imports server code; share contracts through @shared.' }] }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['@server/*', '@/*', '**/server/**', '**/src/**', 'react', 'react-dom', '@tiptap/react'], message: 'shared/ is imported by both sides and imports neither.' }] }],
    },
  },
  {
    files: ['server/engine/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['express', 'typeorm', 'pg', '@server/entities/*', '@server/routes/*', '@server/services/*', '**/entities/**', '**/routes/**'], message: 'The engine is pure: no HTTP or database imports.' }] }],
    },
  },
  {
    // Every computation goes through the shared run queue: only its worker (server/jobs) owns the process's pool.
    files: ['server/routes/**/*.ts', 'server/services/**/*.ts', 'server/middlewares/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { paths: [{ name: '@server/analysis/analysis-pool.ts', importNames: ['getAnalysisPool'], message: 'Queue the run (runCell, rerunCell); only the run worker owns the analysis pool.' }] }],
    },
  },
  {
    // Command-line tools and scripts print to the console by design.
    files: ['scripts/**/*.ts', 'bench/**/*.ts', 'seeds/**/*.ts', 'server/engine/cli.ts', 'fake-s3/**/*.ts', '.ci/**'],
    rules: { 'no-console': 'off' },
  },
  { files: ['**/*.js'], ...tseslint.configs.disableTypeChecked },
);
