/**
 * A search of the interface for the words it no longer uses: the command's help and output
 * (tables, CSV, the drawings it writes, the starter files), the web app's templates, the
 * schemas' descriptions (section, batch, result, results table, OpenAPI) and the e-mails' texts.
 * Each old word is listed with what replaced it. The command runs built (`npm test` builds
 * first). A message that tells a file of an earlier version what to write instead names the old
 * word on purpose; no such file is read here.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';

const ROOT = join(__dirname, '..', '..');
const MAIN = join(ROOT, 'packages', 'cli', 'dist', 'main.js');

/** Old words of the interface, and what says it now. */
const OLD: [RegExp, string][] = [
  [/swedish/i, 'the φ = 0 circle: phi-zero-circle'],
  [/clipped[- ]sine|trapezoid/i, 'a piecewise-linear interslice function'],
  [/\b(lowest|ten|10) (lowest )?trial surfaces\b/i, 'trial surfaces within a band of the least FS'],
  [/least over radii/i, 'least FS at each centre'],
  [/impenetrable/i, 'rigid base: no slip surface enters it'],
  [/\bFAIL\b|\bPASS\b/, 'meets / below the required FS'],
  [
    /\b(\d+|stations?|sections?) failing\b|\bfailing (stations?|sections?)\b|\(fails\)|\bfails? (its|the) required|^\s*fail\s*$/im,
    'below the required FS (a job that "failed" is a job state)',
  ],
  [/\b[a-z]+\(s\)/i, 'plural forms: "1 error", "2 errors"'],
  [/\banalys(e|ed|ing)\b/i, 'one spelling: analyze'],
  [/>\s*Also\s*</, 'a heading that says what the column holds'],
  [/levee-river-side/, 'levee-land-side (it analyzes the land side)'],
];

/** The old words found in a text, with the place they were found. */
function oldWords(where: string, text: string): string[] {
  const found: string[] = [];
  for (const [re, now] of OLD) {
    const m = re.exec(text);
    if (m) {
      const at = text.slice(Math.max(0, m.index - 40), m.index + m[0].length + 40);
      found.push(`${where}: "${m[0]}" in …${at.replace(/\s+/g, ' ')}… (now: ${now})`);
    }
  }
  return found;
}

function run(args: string[], cwd = ROOT): { out: string; err: string } {
  const r = spawnSync(process.execPath, [MAIN, ...args], { cwd, encoding: 'utf8' });
  return { out: r.stdout, err: r.stderr };
}

function files(dir: string, keep: (path: string) => boolean): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? files(path, keep) : keep(path) ? [path] : [];
  });
}

/** The words a template shows: its text, without tags, bindings or control flow. */
const visible = (template: string) =>
  template
    .replace(/<!--[\s\S]*?-->/g, ' ')
    .replace(/<[^>]*>/g, '\n')
    .replace(/\{\{[\s\S]*?\}\}/g, ' ')
    .replace(/@(if|for|switch|case|let|else if)\b[^{\n]*\{?/g, ' ')
    .replace(/^\s*\}\s*$/gm, ' ');

/** The text an SVG shows (its text elements), not its markup. */
const svgWords = (svg: string) =>
  [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]).join('\n');

describe('the interface uses none of its old words', () => {
  test('the command: help, the starters, analyze, plot and batch output, and the drawings', () => {
    const found: string[] = [];
    for (const cmd of [
      [],
      ['validate'],
      ['analyze'],
      ['batch'],
      ['plot'],
      ['init'],
      ['probability'],
      ['sensitivity'],
      ['solve'],
    ])
      found.push(...oldWords(`scarpline ${cmd.join(' ')} --help`, run([...cmd, '--help']).out));
    for (const kind of [
      'cut',
      'embankment',
      'levee',
      'sand-fill',
      'rock-cut',
      'reinforced-embankment',
      'nailed-cut',
    ])
      found.push(...oldWords(`init --kind ${kind}`, run(['init', '--kind', kind, '-']).out));
    const examples = readdirSync(join(ROOT, 'examples'))
      .filter((f) => f.endsWith('.yaml'))
      .map((f) => `examples/${f}`);
    const table = run(['analyze', ...examples]);
    found.push(...oldWords('analyze (table)', table.out + table.err));
    found.push(...oldWords('analyze --csv', run(['analyze', ...examples, '--csv']).out));
    const dir = mkdtempSync(join(tmpdir(), 'scarpline-words-'));
    examples.forEach((f, i) => {
      const into = join(dir, String(i));
      mkdirSync(into);
      const p = run(['plot', f, '--svg', join(into, 'drawing.svg')]);
      found.push(...oldWords(`plot ${f}`, p.out + p.err));
      const drawings = readdirSync(into);
      expect(drawings.length).toBeGreaterThan(0);
      for (const d of drawings)
        found.push(...oldWords(`plot ${f} (${d})`, svgWords(readFileSync(join(into, d), 'utf8'))));
    });
    const out = join(dir, 'batch');
    const b = run(['batch', 'packages/cli/test/fixtures/small-corridor.yaml', '--out', out]);
    found.push(...oldWords('batch', b.out + b.err));
    found.push(
      ...oldWords('batch chainage.svg', svgWords(readFileSync(join(out, 'chainage.svg'), 'utf8'))),
    );
    for (const f of readdirSync(join(out, 'sections')))
      found.push(
        ...oldWords(
          `batch sections/${f}`,
          svgWords(readFileSync(join(out, 'sections', f), 'utf8')),
        ),
      );
    found.push(...oldWords('batch results.csv', readFileSync(join(out, 'results.csv'), 'utf8')));
    expect(found).toEqual([]);
  });

  test("the web app's templates", () => {
    const app = join(ROOT, 'apps', 'web', 'src', 'app');
    const found: string[] = [];
    for (const path of files(app, (p) => p.endsWith('.html')))
      found.push(...oldWords(relative(ROOT, path), visible(readFileSync(path, 'utf8'))));
    // the inline templates of components, and the words their code writes into them
    for (const path of files(app, (p) => p.endsWith('.ts') && !p.endsWith('.spec.ts'))) {
      const code = readFileSync(path, 'utf8');
      const strings = [...code.matchAll(/template: `([\s\S]*?)`,\n/g)].map((m) => visible(m[1]));
      // quoted words a person reads: more than one word, or a capital first
      for (const m of code.matchAll(/'([^'\n]{3,})'|`([^`\n]{3,})`/g)) {
        const s = m[1] ?? m[2];
        if (/\s/.test(s) || /^[A-Z]/.test(s)) strings.push(s.replace(/\$\{[^}]*\}/g, ' '));
      }
      for (const s of strings) found.push(...oldWords(relative(ROOT, path), s));
    }
    expect(found).toEqual([]);
  });

  test("the schemas' descriptions", () => {
    const found: string[] = [];
    const visit = (where: string, node: unknown): void => {
      if (Array.isArray(node)) node.forEach((n) => visit(where, n));
      else if (node && typeof node === 'object')
        for (const [k, v] of Object.entries(node)) {
          if ((k === 'description' || k === 'title' || k === 'summary') && typeof v === 'string')
            found.push(...oldWords(where, v));
          else visit(where, v);
        }
    };
    for (const f of readdirSync(join(ROOT, 'schemas')).filter((f) => f.endsWith('.json')))
      visit(`schemas/${f}`, JSON.parse(readFileSync(join(ROOT, 'schemas', f), 'utf8')));
    expect(found).toEqual([]);
  });

  test("the e-mails' texts", () => {
    const code = readFileSync(join(ROOT, 'apps', 'api', 'src', 'services', 'mail.ts'), 'utf8');
    // the texts the messages are made of: quoted and template strings outside comments
    const texts = [
      ...code.replace(/\/\/.*$|\/\*[\s\S]*?\*\//gm, '').matchAll(/'([^'\n]*)'|`([^`]*)`/g),
    ]
      .map((m) => m[1] ?? m[2])
      .join('\n');
    expect(oldWords('apps/api/src/services/mail.ts', texts)).toEqual([]);
  });

  test('the search finds an old word where there is one', () => {
    expect(oldWords('t', 'FAIL').length).toBeGreaterThan(0);
    expect(oldWords('t', '3 error(s) in the input')).toHaveLength(1);
    expect(oldWords('t', 'analyse section files').length).toBeGreaterThan(0);
    expect(oldWords('t', '<th scope="col">Also</th>').length).toBeGreaterThan(0);
    expect(oldWords('t', '10 lowest trial surfaces').length).toBeGreaterThan(0);
    expect(oldWords('t', 'method swedish-circle').length).toBeGreaterThan(0);
    expect(oldWords('t', '5 failing').length).toBeGreaterThan(0);
    expect(oldWords('t', 'below 1.50 (fails)').length).toBeGreaterThan(0);
    expect(oldWords('t', 'the job failed; 3 analyses; 1 below the required FS; 2 errors')).toEqual(
      [],
    );
  });
});
