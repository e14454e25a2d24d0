// Lint rules. The one that matters most: the analysis core stays pure (no I/O, clocks, randomness).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const impureModules = ['fs', 'node:fs', 'fs/promises', 'node:fs/promises', 'child_process', 'node:child_process',
  'timers', 'node:timers', 'net', 'node:net', 'os', 'node:os', 'blessed', 'blessed-contrib', 'chokidar', 'worker_threads', 'node:worker_threads'];

// Dependencies point inward (architecture.md): the core stages never import a view, the shell or the
// demo.
const outerLayers = ['cli', 'ui', 'report', 'gate', 'monitor', 'demo', 'bench'].map((folder) => ({
  group: [`../${folder}/*`],
  message: `the core stages do not depend on src/${folder} (dependencies point inward, see DEVELOPERS.md)`,
}));

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'sample-logs/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { process: 'readonly', console: 'readonly', Buffer: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly', setInterval: 'readonly', clearInterval: 'readonly', setImmediate: 'readonly', URL: 'readonly', TextDecoder: 'readonly', TextEncoder: 'readonly', AbortController: 'readonly', performance: 'readonly', queueMicrotask: 'readonly' } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['src/ingest/**/*.ts', 'src/parse/**/*.ts', 'src/series/**/*.ts', 'src/text/**/*.ts'],
    rules: { 'no-restricted-imports': ['error', { patterns: outerLayers }] },
  },
  {
    files: ['src/analysis/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        paths: impureModules.map((name) => ({ name, message: 'src/analysis is pure: no I/O here (see DEVELOPERS.md).' })),
        patterns: [...outerLayers, { group: ['../ingest/*', '../parse/*.js', '!../parse/log-record.js'], message: 'src/analysis reads series, not sources or parsers' }],
      }],
      'no-restricted-globals': ['error',
        { name: 'console', message: 'src/analysis is pure: return data, do not print.' },
        { name: 'process', message: 'src/analysis is pure: no process access.' },
        { name: 'setTimeout', message: 'src/analysis is pure: no timers.' },
        { name: 'setInterval', message: 'src/analysis is pure: no timers.' },
        { name: 'performance', message: 'src/analysis is pure: no clocks.' }],
      'no-restricted-properties': ['error',
        { object: 'Date', property: 'now', message: 'src/analysis is pure: no clocks.' },
        { object: 'Math', property: 'random', message: 'src/analysis is pure: no randomness; take a seeded generator.' }],
    },
  },
);
