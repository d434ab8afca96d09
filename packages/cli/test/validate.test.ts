import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// These tests run the built command (`npm test` builds first).
const ROOT = join(__dirname, '..', '..', '..');
const MAIN = join(ROOT, 'packages', 'cli', 'dist', 'main.js');
const BAD = join(ROOT, 'packages', 'core', 'test', 'in');

function run(args: string[], shell = false) {
  const result = shell
    ? spawnSync('sh', ['-c', `node ${JSON.stringify(MAIN)} ${args.join(' ')}`], {
        cwd: ROOT,
        encoding: 'utf8',
      })
    : spawnSync(process.execPath, [MAIN, ...args], { cwd: ROOT, encoding: 'utf8' });
  return { code: result.status, out: result.stdout, err: result.stderr };
}

beforeAll(() => {
  if (!existsSync(MAIN)) throw new Error(`${MAIN} is missing: run npm run build first`);
});

describe('scarpline validate', () => {
  test('every example is valid: exit 0 (`scarpline validate examples/*`)', () => {
    const { code, out, err } = run(['validate', 'examples/*'], true);
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).toMatch(/examples\/cut-homogeneous\.yaml: valid: 1 section$/m);
    expect(out).toMatch(/examples\/embankment-stages\.yaml: valid: 1 section$/m);
    // A directory is searched recursively: the corridor batch is found.
    expect(out).toMatch(/examples\/corridor\/corridor\.json: valid: \d{2,} sections$/m);
    expect(out).not.toMatch(/invalid/);
  });

  test('a malformed file: located messages, a summary, exit 1', () => {
    const { code, out } = run(['validate', join(BAD, 'ranges.yaml')]);
    expect(code).toBe(1);
    expect(out).toContain(
      `${join(BAD, 'ranges.yaml')}:7:90 materials.clay.strength.frictionAngle: 95 is above 90°`,
    );
    expect(out).toMatch(/ranges\.yaml: invalid: 13 errors$/m);
  });

  test("design cases: each message at the case's setting, in a section and in a corridor", () => {
    const file = join(BAD, 'cases.yaml');
    const { code, out } = run(['validate', file]);
    expect(code).toBe(1);
    expect(out).toContain(
      `${file}:23:20 cases[1].drawdown.materials.bnak: no material of the section is named "bnak"; did you mean bank?`,
    );
    expect(out).toContain(
      `${file}:57:9 sections[1].cases[1]: kind is missing (end-of-construction, long-term,`,
    );
    expect(out).toMatch(/cases\.yaml: invalid: 10 errors, 3 warnings$/m);
  });

  test('valid and invalid files together: exit 1, each file summarised', () => {
    const { code, out } = run([
      'validate',
      'examples/cut-homogeneous.yaml',
      join(BAD, 'syntax.yaml'),
    ]);
    expect(code).toBe(1);
    expect(out).toMatch(/cut-homogeneous\.yaml: valid: 1 section$/m);
    expect(out).toMatch(/syntax\.yaml:5:1 YAML syntax error: /);
    expect(out).toMatch(/syntax\.yaml: invalid: 1 error$/m);
  });

  test('warnings alone do not fail a file', () => {
    const { code, out } = run(['validate', join(BAD, 'clipped.yaml')]);
    expect(code).toBe(0);
    expect(out).toMatch(/clipped\.yaml:12:28 warning: strata\[1\]\.top: rises above the ground/);
    expect(out).toMatch(/clipped\.yaml: valid: 1 section, 2 warnings$/m);
  });

  test('a missing file is a plain message (no stack trace) and exit 1', () => {
    const { code, out, err } = run(['validate', 'no/such/file.yaml']);
    expect(code).toBe(1);
    expect(out).toContain('no/such/file.yaml: no such file or directory');
    expect(out + err).not.toMatch(/\n\s+at /);
  });

  test('a directory without section files is an error', () => {
    const dir = mkdtempSync(join(tmpdir(), 'scarpline-'));
    writeFileSync(join(dir, 'notes.txt'), 'nothing here');
    const { code, out } = run(['validate', dir]);
    expect(code).toBe(1);
    expect(out).toContain('no .yaml, .yml or .json files found');
  });

  test('no file given: usage error, exit 1', () => {
    const { code, err } = run(['validate']);
    expect(code).toBe(1);
    expect(err).toMatch(/missing required argument/);
  });
});

describe('scarpline --help and --version', () => {
  test('--version prints the package version', () => {
    const { code, out } = run(['--version']);
    expect(code).toBe(0);
    expect(out.trim()).toMatch(/^\d+\.\d+\.\d+$/);
  });

  test('--help lists validate and shows an example', () => {
    const { code, out } = run(['--help']);
    expect(code).toBe(0);
    expect(out).toContain('validate');
    expect(out).toMatch(/Examples?:/);
  });

  test('validate --help explains the exit status', () => {
    const { code, out } = run(['validate', '--help']);
    expect(code).toBe(0);
    expect(out).toContain('scarpline validate examples/cut-homogeneous.yaml');
    expect(out).toContain('Exit status: 0 when every file is valid, 1 otherwise.');
  });
});
