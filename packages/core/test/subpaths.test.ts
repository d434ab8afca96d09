/**
 * The package's entry points (package.json `exports`): each subpath loads alone, through Node's
 * own resolution of the built package, without the solver; the browser-safe ones load nothing
 * outside the core and have an ES module build that imports nothing but its own files; and
 * every list that names the subpaths (types for CommonJS callers, the browser build, Jest's
 * map, the tests' tsconfig) names the same ones.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import * as core from '@scarpline/core';

// eslint-disable-next-line @typescript-eslint/no-require-imports -- Jest's own map, in JavaScript
const { coreModuleNameMapper } = require('../jest-map') as {
  coreModuleNameMapper: (coreDir: string) => Record<string, string>;
};

const CORE = join(__dirname, '..');
const ROOT = join(CORE, '..', '..');
const DIST = join(CORE, 'dist');
const readJson = (file: string) => JSON.parse(readFileSync(file, 'utf8')) as unknown;

interface Conditions {
  types: string;
  browser?: string;
  default: string;
}
const pkg = readJson(join(CORE, 'package.json')) as {
  exports: Record<string, Conditions | string>;
  typesVersions: Record<string, Record<string, string[]>>;
};
const subpaths = Object.keys(pkg.exports).filter((k) => k !== '.' && k !== './package.json');
const names = subpaths.map((k) => k.slice(2));
const browserSafe = names.filter((n) => (pkg.exports[`./${n}`] as Conditions).browser);
/** The solver's own modules: no subpath but the root loads them. */
const SOLVER = /^(analyze\.js|(search|slices|methods|numeric)\/)/;

/** The files a fresh Node process loads for `require(specifier)`, and the names it exports. */
function load(specifier: string): { core: string[]; outside: string[]; names: string[] } {
  const script = `
    const m = require(${JSON.stringify(specifier)});
    const files = Object.keys(require.cache).filter((f) => f !== __filename);
    process.stdout.write(JSON.stringify({ files, names: Object.keys(m).sort() }));`;
  const r = spawnSync(process.execPath, ['-e', script], { cwd: ROOT, encoding: 'utf8' });
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  const { files, names: exported } = JSON.parse(r.stdout) as { files: string[]; names: string[] };
  return {
    core: files.filter((f) => f.startsWith(DIST + sep)).map((f) => relative(DIST, f)),
    outside: files.filter((f) => !f.startsWith(DIST + sep)),
    names: exported,
  };
}

beforeAll(() => {
  if (!existsSync(join(DIST, 'index.js')) || !existsSync(join(DIST, 'browser'))) {
    throw new Error('packages/core/dist is missing: run npm run build first');
  }
});

test('the subpaths, each an entry module of src/ built to dist/', () => {
  expect(names).toEqual([
    'model',
    'input',
    'units',
    'formats',
    'caution',
    'verdict',
    'result',
    'draw',
    'export',
  ]);
  for (const n of names) {
    expect(existsSync(join(CORE, 'src', `${n}.ts`))).toBe(true);
    expect(pkg.exports[`./${n}`]).toMatchObject({
      types: `./dist/${n}.d.ts`,
      default: `./dist/${n}.js`,
    });
  }
});

describe.each(names)('@scarpline/core/%s', (name) => {
  let loaded: ReturnType<typeof load>;
  beforeAll(() => {
    loaded = load(`@scarpline/core/${name}`);
  });

  test('loads without the solver, and exports only what the root exports too', () => {
    expect(loaded.core).toContain(`${name}.js`);
    expect(loaded.core.filter((f) => SOLVER.test(f.split(sep).join('/')))).toEqual([]);
    expect(loaded.core).not.toContain('index.js');
    for (const n of loaded.names) expect(Object.keys(core)).toContain(n);
  });

  if (browserSafe.includes(name)) {
    test('is browser-safe: loads nothing outside the core', () => {
      expect(loaded.outside).toEqual([]);
    });
  }
});

test('the root loads the solver (a test that the check above can fail)', () => {
  const root = load('@scarpline/core');
  expect(root.core).toContain('analyze.js');
  expect(root.core.some((f) => f.startsWith(`search${sep}`))).toBe(true);
});

test('a path that is not a subpath does not resolve, whatever is in dist/', () => {
  const r = spawnSync(process.execPath, ['-e', "require('@scarpline/core/dist/analyze.js')"], {
    cwd: ROOT,
    encoding: 'utf8',
  });
  expect(r.status).not.toBe(0);
  expect(r.stderr).toContain('ERR_PACKAGE_PATH_NOT_EXPORTED');
});

describe('the browser build (tsconfig.browser.json → dist/browser, ES modules)', () => {
  const files = (dir: string): string[] =>
    readdirSync(dir).flatMap((f) =>
      statSync(join(dir, f)).isDirectory()
        ? files(join(dir, f))
        : f.endsWith('.js')
          ? [join(dir, f)]
          : [],
    );

  test('builds exactly the browser-safe subpaths, each at its `browser` condition', () => {
    const tsconfig = readJson(join(CORE, 'tsconfig.browser.json')) as { files: string[] };
    expect([...tsconfig.files].sort()).toEqual(browserSafe.map((n) => `src/${n}.ts`).sort());
    for (const n of browserSafe) {
      expect((pkg.exports[`./${n}`] as Conditions).browser).toBe(`./dist/browser/${n}.js`);
      expect(existsSync(join(DIST, 'browser', `${n}.js`))).toBe(true);
    }
  });

  test('imports nothing but its own files: no package, no Node module, no require', () => {
    const built = files(join(DIST, 'browser'));
    expect(built.length).toBeGreaterThan(browserSafe.length);
    for (const f of built) {
      const text = readFileSync(f, 'utf8');
      const specifiers = [...text.matchAll(/\bfrom\s+'([^']+)'/g)].map((m) => m[1]);
      expect({ f, bare: specifiers.filter((s) => !s.startsWith('.')) }).toEqual({ f, bare: [] });
      expect({ f, require: /\brequire\(/.test(text) }).toEqual({ f, require: false });
      // the solver never reaches the browser build
      expect({
        f,
        solver: SOLVER.test(relative(join(DIST, 'browser'), f).split(sep).join('/')),
      }).toEqual({ f, solver: false });
    }
  });
});

test('CommonJS callers get the same subpaths typed (typesVersions, for node10 resolution)', () => {
  expect(pkg.typesVersions).toEqual({
    '*': Object.fromEntries(names.map((n) => [n, [`dist/${n}.d.ts`]])),
  });
});

test("Jest's map and the tests' tsconfig send the same subpaths to the sources", () => {
  const map = coreModuleNameMapper('<core>');
  const [, pattern] = Object.keys(map);
  for (const n of names) expect(`@scarpline/core/${n}`).toMatch(new RegExp(pattern));
  expect('@scarpline/core/analyze').not.toMatch(new RegExp(pattern));
  for (const file of ['tsconfig.json', 'apps/api/test/tsconfig.json']) {
    const paths = (readJson(join(ROOT, file)) as { compilerOptions: { paths: object } })
      .compilerOptions.paths;
    expect(Object.keys(paths)).toEqual(['@scarpline/core', '@scarpline/core/*']);
  }
});
