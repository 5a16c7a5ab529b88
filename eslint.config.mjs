// ESLint with typescript-eslint's type-aware rules. The layer rules of
// docs/architecture.md are `no-restricted-imports` here; scripts/lint-reach.mjs
// keeps only what ESLint cannot express: what the activation bundle reaches.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import { builtinModules } from 'node:module';

// Matched as whole module names (a regex), so that a relative './quantities/constants' is not taken for Node's `constants`.
const nodeBuiltins = [
  `^(node:)?(${builtinModules
    .filter((m) => !m.startsWith('_'))
    .map((m) => m.replace(/[/]/g, '\\/'))
    .join('|')})(\\/.*)?$`,
];
const editorPackages = ['vscode', 'vscode-languageclient', 'vscode-languageclient/*'];
const protocolPackages = [
  'vscode-languageserver',
  'vscode-languageserver/*',
  'vscode-languageserver-protocol',
  'vscode-languageserver-protocol/*',
  'vscode-languageserver-textdocument',
  'vscode-jsonrpc',
  'vscode-jsonrpc/*',
];
const forbid = (message, groups, regexes = []) => ({
  'no-restricted-imports': [
    'error',
    { patterns: [{ group: groups.flat(), message }, ...regexes.map((regex) => ({ regex, message }))] },
  ],
});

export default tseslint.config(
  {
    ignores: [
      'node_modules/',
      'dist/',
      'out/',
      '.editor-host/',
      '.editor-host-newest/',
      'test-output/',
      '**/*.d.cts',
      'eslint.config.mjs',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommendedTypeChecked,
  {
    languageOptions: {
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    rules: {
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/no-misused-promises': 'error',
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' },
      ],
      // `import x = require('…')` is TypeScript's typed import of a CommonJS package (the stdlib packages export
      // a function as the module itself); plain `require()` calls stay forbidden.
      '@typescript-eslint/no-require-imports': ['error', { allowAsImport: true }],
      // Off: the code writes `xs[i]!` on indexed reads, in the style of noUncheckedIndexedAccess, so that the
      // places are marked for when tsconfig turns that option on (363 reads to settle first). Without the
      // option the `!` changes no type, and this rule would strip every one of them.
      '@typescript-eslint/no-unnecessary-type-assertion': 'off',
    },
  },
  {
    // Tests drive pages through Playwright's evaluate and read JSON from processes: those values are `any` by
    // the libraries' own types, and the tests check them with assertions instead of the type system.
    files: ['test/**/*.ts', 'bench/**/*.ts'],
    rules: {
      '@typescript-eslint/no-unsafe-member-access': 'off',
      '@typescript-eslint/no-unsafe-assignment': 'off',
      '@typescript-eslint/no-unsafe-call': 'off',
      '@typescript-eslint/no-unsafe-argument': 'off',
      '@typescript-eslint/no-unsafe-return': 'off',
      // The same values, and the stand-ins for the editor's API in the page, are typed `any` where they are made.
      '@typescript-eslint/no-explicit-any': 'off',
      // Reference values are written with every digit their source gives (mpmath, CODATA); the literal becomes
      // the nearest double, which is exactly what the comparison wants.
      'no-loss-of-precision': 'off',
    },
  },
  {
    files: ['**/*.mjs', '**/*.cjs', '**/*.js'],
    extends: [tseslint.configs.disableTypeChecked],
    languageOptions: {
      globals: {
        process: 'readonly',
        console: 'readonly',
        require: 'readonly',
        module: 'writable',
        __dirname: 'readonly',
        Buffer: 'readonly',
        setTimeout: 'readonly',
        clearTimeout: 'readonly',
        setImmediate: 'readonly',
        URL: 'readonly',
      },
    },
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  // The layers (docs/architecture.md).
  {
    files: ['src/core/**/*.ts'],
    rules: forbid(
      'src/core is pure: no editor, no protocol package, no Node built-in.',
      [editorPackages, protocolPackages],
      nodeBuiltins,
    ),
  },
  {
    files: ['src/shared/**/*.ts'],
    rules: forbid(
      'src/shared is read by client and server alike: the protocol types and the core only.',
      [editorPackages, ['vscode-languageserver', 'vscode-languageserver/*']],
      nodeBuiltins,
    ),
  },
  {
    files: ['src/server/**/*.ts'],
    rules: forbid('The server knows no editor: never vscode or the language client.', [editorPackages]),
  },
  {
    files: ['src/cli/**/*.ts'],
    rules: forbid('The command line needs no editor and no protocol.', [editorPackages, protocolPackages]),
  },
  {
    files: ['src/client/**/*.ts'],
    rules: forbid('The client talks to the server only through the language client and src/shared.', [
      ['vscode-languageserver', 'vscode-languageserver/*', '**/server/*', '**/server', '**/cli/*'],
    ]),
  },
  {
    files: ['media/src/**/*.ts'],
    rules: forbid(
      'The page has no Node and no editor API; it reaches the core only through core/packageFree.',
      [editorPackages, protocolPackages],
      nodeBuiltins,
    ),
  },
);
