// ESLint flat config for all workspaces; Prettier owns formatting.
//
// - typescript-eslint's type-aware rules (recommendedTypeChecked) on every TypeScript file, with
//   the project service: each file is checked with the tsconfig.json that includes it (a
//   package's own, the root one for the core's, the CLI's and the verification tests,
//   apps/api/test/tsconfig.json, the web app's solution-style tsconfig.json).
// - angular-eslint's recommended TypeScript, template and template-accessibility rules on the
//   web app.
// - The package boundaries (no-restricted-imports, and no-restricted-syntax for import() and
//   require()): what the core, its drawing, the web app and the CLI, the report writers and the
//   API may import.
//   DEVELOPERS.md ("Package boundaries") says why; tests/boundaries shows each rule failing.
// A rule turned off says why in a line beside it.
const { builtinModules } = require('node:module');
const js = require('@eslint/js');
const tseslint = require('typescript-eslint');
const angular = require('angular-eslint');
const prettier = require('eslint-config-prettier');
const globals = require('globals');
const coreExports = require('./packages/core/package.json').exports;

/** The core's subpaths (package.json `exports`) and those built for the browser. */
const SUBPATHS = Object.keys(coreExports)
  .filter((k) => k !== '.' && k !== './package.json')
  .map((k) => k.slice(2));
const BROWSER_SUBPATHS = SUBPATHS.filter((n) => coreExports[`./${n}`].browser);
const TYPE_ONLY_SUBPATHS = SUBPATHS.filter((n) => !BROWSER_SUBPATHS.includes(n));

/**
 * A boundary: module specifiers a group of files may not import, each a regular expression
 * with the reason. `typesAllowed`: `import type` from it is fine (nothing is loaded).
 */
const rule = (regex, message, typesAllowed = false) => ({ regex, message, typesAllowed });
const exactly = (name) => `^${name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}$`;

/**
 * The rule settings that enforce boundaries on a group of files: no-restricted-imports for
 * `import`/`export … from` (typescript-eslint's, which knows `import type`), no-restricted-syntax
 * for `import()` and `require()`, which it does not see. Give every boundary of the group at
 * once: a later setting of a rule replaces an earlier one for the same file.
 */
function restrict(...boundaries) {
  const rules = boundaries.flat();
  // esquery reads a regular expression up to the next "/": write "/" as \x2F
  const literal = (re) => `/${re.replace(/\\?\//g, '\\x2F')}/`;
  return {
    'no-restricted-imports': 'off',
    '@typescript-eslint/no-restricted-imports': [
      'error',
      {
        patterns: rules.map((r) => ({
          regex: r.regex,
          message: r.message,
          ...(r.typesAllowed ? { allowTypeImports: true } : {}),
        })),
      },
    ],
    'no-restricted-syntax': [
      'error',
      ...rules.flatMap((r) => [
        { selector: `ImportExpression[source.value=${literal(r.regex)}]`, message: r.message },
        {
          selector: `CallExpression[callee.name="require"][arguments.0.value=${literal(r.regex)}]`,
          message: r.message,
        },
      ]),
    ],
  };
}

/** The core is pure: it runs in a browser. No Node built-in module, with or without `node:`. */
const NODE_MODULES = builtinModules.filter((m) => !m.startsWith('_'));
const PURE_CORE = [
  rule(
    String.raw`^(node:|(${NODE_MODULES.map((m) => m.replace(/\//g, '\\/')).join('|')})(\/|$))`,
    'The core is pure (no file, network or process access, no Node module): do the I/O in the CLI or the API.',
  ),
];

/** A drawing takes a result: it never runs the solver, nor imports the whole core. */
const DRAWING_TAKES_A_RESULT = [
  rule(
    String.raw`^\.\.\/(analyze|search|slices|methods|numeric)(\/.*)?$`,
    'draw/ draws a result (its types come from ../result): it does not run the analysis, the search, the slicer or a method.',
  ),
  rule(String.raw`^\.\.(\/index)?\/?$`, 'draw/ imports the modules it needs, not the whole core.'),
];

/** The web app imports the core only by its subpaths, and values only from the browser-safe ones. */
const WEB_IMPORTS_SUBPATHS = [
  rule(
    exactly('@scarpline/core'),
    `The web app imports the core by subpath: @scarpline/core/{${SUBPATHS.join(',')}}.`,
  ),
  ...TYPE_ONLY_SUBPATHS.map((n) =>
    rule(
      exactly(`@scarpline/core/${n}`),
      `@scarpline/core/${n} is not built for the browser: import its types only (import type).`,
      true,
    ),
  ),
  rule(
    String.raw`^@scarpline\/core\/(?!(${SUBPATHS.join('|')})$)`,
    `Not a subpath of the core: use one of @scarpline/core/{${SUBPATHS.join(',')}}.`,
  ),
  rule(
    String.raw`(^|\/)packages\/core(\/|$)`,
    'Import the core by its package subpaths, not by a path into packages/core.',
  ),
  rule(
    String.raw`^@scarpline\/(api|cli|report)(\/|$)`,
    'The web app talks to the API over HTTP; it imports no other workspace (the report writers are Node-side).',
  ),
];

/** The CLI and the API use the core's public entry points, never its files. */
const CORE_BY_ENTRY_POINT = [
  rule(
    String.raw`^@scarpline\/core\/(src|dist)(\/|$)|(^|\/)packages\/core(\/|$)|^(\.\.\/)+core\/(src|dist)(\/|$)`,
    `Import @scarpline/core or one of its subpaths (${SUBPATHS.join(', ')}), not a file of the core.`,
  ),
];

module.exports = tseslint.config(
  {
    ignores: [
      '**/node_modules/**',
      '**/dist/**',
      '**/coverage/**',
      '**/.angular/**',
      'apps/web/out-tsc/**',
    ],
  },
  js.configs.recommended,
  // the non-type-aware rules on every file (their TypeScript-only settings stay on .ts files)
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
    },
  },

  // --- TypeScript everywhere: type-aware
  {
    files: ['**/*.ts'],
    extends: [tseslint.configs.recommendedTypeChecked],
    languageOptions: {
      parserOptions: { projectService: true, tsconfigRootDir: __dirname },
    },
  },
  {
    files: ['packages/core/src/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'error' },
  },
  {
    files: [
      '**/test/**/*.ts',
      'tests/**/*.ts',
      'apps/web/src/**/*.spec.ts',
      'apps/web/src/app/testing/**',
    ],
    // Tests read what they check as `any` (HTTP bodies, parsed files, Angular's nativeElement)
    // and assert its shape with expect; typing each body first would restate what they test.
    rules: {
      '@typescript-eslint/no-unsafe-argument': 'off',
      '@typescript-eslint/no-unsafe-assignment': 'off',
      '@typescript-eslint/no-unsafe-call': 'off',
      '@typescript-eslint/no-unsafe-member-access': 'off',
      '@typescript-eslint/no-unsafe-return': 'off',
    },
  },

  // --- JavaScript: Node scripts in CommonJS, without type information
  {
    files: ['**/*.js'],
    extends: [tseslint.configs.disableTypeChecked],
    languageOptions: {
      sourceType: 'commonjs',
      globals: globals.node,
    },
    rules: {
      '@typescript-eslint/no-require-imports': 'off',
      'no-redeclare': ['error', { builtinGlobals: false }],
    },
  },

  // --- the web app: angular-eslint
  {
    files: ['apps/web/src/**/*.ts'],
    extends: [angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      // Angular's Validators.required and kin are static functions that use no `this`.
      '@typescript-eslint/unbound-method': ['error', { ignoreStatic: true }],
      '@angular-eslint/component-selector': [
        'error',
        { type: 'element', prefix: 'sl', style: 'kebab-case' },
      ],
      '@angular-eslint/directive-selector': [
        'error',
        { type: 'attribute', prefix: 'sl', style: 'camelCase' },
      ],
    },
  },
  {
    files: ['apps/web/src/**/*.html'],
    extends: [angular.configs.templateRecommended, angular.configs.templateAccessibility],
  },

  // --- package boundaries
  {
    files: ['packages/core/src/**/*.ts'],
    rules: {
      ...restrict(PURE_CORE),
      'no-restricted-globals': [
        'error',
        ...['process', 'Buffer', '__dirname', '__filename', 'global'].map((name) => ({
          name,
          message: 'The core is pure: it runs in a browser, without Node globals.',
        })),
      ],
    },
  },
  {
    files: ['packages/core/src/draw/**/*.ts'],
    rules: restrict(PURE_CORE, DRAWING_TAKES_A_RESULT),
  },
  { files: ['apps/web/src/**/*.ts'], rules: restrict(WEB_IMPORTS_SUBPATHS) },
  {
    files: [
      'packages/cli/{src,test,bench}/**/*.{ts,js}',
      'packages/report/{src,test}/**/*.{ts,js}',
      'packages/terrain/{src,test}/**/*.{ts,js}',
      'apps/api/{src,test,bench}/**/*.{ts,js}',
    ],
    rules: restrict(CORE_BY_ENTRY_POINT),
  },

  prettier,
);
