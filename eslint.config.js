// Layer rules (DEVELOPERS.md, "Layers"): machines, not reviewers, check the import direction.
import tseslint from 'typescript-eslint';

const nodeBuiltins = ['node:*', 'fs', 'path', 'os', 'child_process', 'worker_threads', 'url', 'crypto', 'stream', 'process', 'util', 'events', 'buffer', 'readline', 'http', 'net', 'zlib'];
const bareBuiltins = (message) => nodeBuiltins.filter((n) => n !== 'node:*').map((name) => ({ name, message }));
const noRandom = {
  selector: "MemberExpression[object.name='Math'][property.name='random']",
  message: 'Math.random is banned here: use the seeded generator in core/rng.ts.',
};
const noOnly = {
  selector: "CallExpression[callee.object.name=/^(it|test|describe)$/][callee.property.name='only']",
  message: '.only would silently skip the rest of the suite.',
};

export default tseslint.config(
  { ignores: ['node_modules/**', 'dist/**', 'dist-node/**', 'dist-electron/**', '**/*.svelte', '**/*.mjs', '**/*.js', '**/*.cjs'] },
  {
    files: ['**/*.ts'],
    languageOptions: { parser: tseslint.parser },
    plugins: { '@typescript-eslint': tseslint.plugin },
    rules: {
      'no-debugger': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['core/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        // Bare built-in names are exact paths: as patterns, 'events' would also match core/synth/events.
        paths: [{ name: 'electron', message: 'core/ is pure TypeScript: no Electron.' }, ...bareBuiltins('core/ is pure TypeScript: no Node imports (it runs in Web Workers too).')],
        patterns: [
          { group: ['node:*'], message: 'core/ is pure TypeScript: no Node imports (it runs in Web Workers too).' },
          { group: ['**/app/**', '../app/**', '../../app/**'], message: 'core/ imports nothing outside core/.' },
        ],
      }],
      'no-restricted-globals': ['error', 'window', 'document', 'process', 'Buffer', 'require', '__dirname'],
      'no-restricted-syntax': ['error', noRandom],
    },
  },
  {
    files: ['app/renderer/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        paths: [{ name: 'electron', message: 'The renderer talks to the main process only through window.dipweave (preload).' }, ...bareBuiltins('The renderer runs in a browser: no Node imports.')],
        patterns: [
          { group: ['node:*'], message: 'The renderer runs in a browser: no Node imports.' },
          { group: ['**/main/**', '**/host/**', '**/cli/**', '**/preload/**'], message: 'The renderer never imports app/main, app/host, app/cli or app/preload.' },
        ],
      }],
    },
  },
  {
    files: ['app/cli/**/*.ts', 'app/shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        paths: [{ name: 'electron', message: 'Only app/main and app/preload may import electron.' }],
      }],
    },
  },
  {
    files: ['test/**/*.ts'],
    rules: { 'no-restricted-syntax': ['error', noRandom, noOnly] },
  },
);
