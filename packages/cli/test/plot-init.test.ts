import { mkdtempSync, readFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { PNG } from 'pngjs';
import { run } from './run';

const dir = mkdtempSync(join(tmpdir(), 'scarpline-plot-'));
/** A file of two section documents (a section written twice, one design case each). */
const TWO = 'packages/core/test/fixtures/embankment-stages-two-documents.yaml';

describe('scarpline plot', () => {
  test('writes a well-formed SVG of the section with its critical surface and the caution', () => {
    const out = join(dir, 'levee.svg');
    const r = run(['plot', 'examples/levee-land-side.yaml', '--svg', out]);
    expect(r.code).toBe(0);
    expect(r.out).toContain(`wrote ${out}: wfb-0410, governing FS 1.275 (bishop)`);
    // the terminal's result carries the caution too
    expect(r.out).toMatch(/\nCaution: Results are for review by a qualified geotechnical engineer/);
    const svg = readFileSync(out, 'utf8');
    expect(XMLValidator.validate(svg)).toBe(true);
    const tree = new XMLParser({ ignoreAttributes: false }).parse(svg) as {
      svg: Record<string, string>;
    };
    expect(tree.svg['@_xmlns']).toBe('http://www.w3.org/2000/svg');
    expect(svg).toContain('class="critical"');
    expect(svg).toContain('elevation (m)');
    expect(svg).toMatch(/Caution: Results are for review by a qualified geotechnical engineer/);
  });

  test('several sections: one file each, or --section for one', () => {
    const base = join(dir, 'stages.svg');
    const r = run(['plot', TWO, '--svg', base]);
    expect(r.code).toBe(0);
    expect(existsSync(join(dir, 'stages-wcb-2940-R-eoc.svg'))).toBe(true);
    expect(existsSync(join(dir, 'stages-wcb-2940-R-lt.svg'))).toBe(true);
    const one = run(['plot', TWO, '--svg', join(dir, 'lt.svg'), '--section', 'wcb-2940-R-lt']);
    expect(one.code).toBe(0);
    expect(readFileSync(join(dir, 'lt.svg'), 'utf8')).toContain('long term');
    const none = run(['plot', TWO, '--svg', join(dir, 'x.svg'), '--section', 'nope']);
    expect(none.code).toBe(1);
    expect(none.err).toMatch(/--section: no section "nope"/);
  });

  test('--png: the same drawing as a PNG image of its size, beside or instead of the SVG', () => {
    const svgOut = join(dir, 'both.svg');
    const pngOut = join(dir, 'both.png');
    const r = run(['plot', 'examples/levee-land-side.yaml', '--svg', svgOut, '--png', pngOut]);
    expect(r.code).toBe(0);
    expect(r.out).toContain(`wrote ${svgOut} and ${pngOut}: wfb-0410, governing FS 1.275 (bishop)`);
    const png = readFileSync(pngOut);
    // the PNG signature and the IHDR width and height (PNG specification, ISO/IEC 15948 §5.2, §11.2.2)
    expect([...png.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    const [, w, h] = /width="(\d+)" height="(\d+)"/.exec(readFileSync(svgOut, 'utf8'))!;
    expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([Number(w), Number(h)]);
    // the strata drawn: each material's fill (from the SVG) covers pixels of the image
    const svg = readFileSync(svgOut, 'utf8');
    const strata = /<g class="strata">(.*?)<\/g>/.exec(svg)![1];
    const fills = [...new Set([...strata.matchAll(/fill="(#[0-9a-f]{6})"/g)].map((m) => m[1]))];
    expect(fills.length).toBe(3);
    const { data } = PNG.sync.read(png);
    const count = new Map<string, number>();
    for (let i = 0; i < data.length; i += 4) {
      const hex = `#${[data[i], data[i + 1], data[i + 2]].map((v) => v.toString(16).padStart(2, '0')).join('')}`;
      count.set(hex, (count.get(hex) ?? 0) + 1);
    }
    for (const f of fills) expect([f, (count.get(f) ?? 0) > 500]).toEqual([f, true]);
    const several = run(['plot', TWO, '--png', join(dir, 'drawn.png')]);
    expect(several.code).toBe(0);
    expect(existsSync(join(dir, 'drawn-wcb-2940-R-eoc.png'))).toBe(true);
    expect(existsSync(join(dir, 'drawn-wcb-2940-R-lt.png'))).toBe(true);
    expect(existsSync(join(dir, 'drawn-wcb-2940-R-lt.svg'))).toBe(false);
  });

  test('a bad file: located messages, no drawing, exit 1; --svg or --png is required', () => {
    const r = run(['plot', 'packages/core/test/in/ranges.yaml', '--svg', join(dir, 'bad.svg')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/ranges\.yaml:7:90 materials\.clay\.strength\.frictionAngle/);
    expect(existsSync(join(dir, 'bad.svg'))).toBe(false);
    const missing = run(['plot', 'examples/levee-land-side.yaml']);
    expect(missing.code).toBe(1);
    expect(missing.err).toMatch(/give --svg <out>, --png <out> or both/);
  });
});

describe('scarpline init', () => {
  test.each([
    'cut',
    'embankment',
    'levee',
    'sand-fill',
    'rock-cut',
    'reinforced-embankment',
    'nailed-cut',
  ])('--kind %s writes a commented starter that validates and analyses', (kind) => {
    const file = join(dir, `${kind}.yaml`);
    const w = run(['init', '--kind', kind, file]);
    expect(w.code).toBe(0);
    const text = readFileSync(file, 'utf8');
    expect(text.split('\n').filter((l) => /^\s*#/.test(l)).length).toBeGreaterThan(5);
    expect(run(['validate', file])).toMatchObject({
      code: 0,
      out: `${file}: valid: 1 section\n`,
    });
    const a = run(['analyze', file]);
    expect([0, 2]).toContain(a.code); // a factor of safety either way
    expect(a.out).toMatch(/governing: [a-z-]+ FS \d\.\d{3} against required/);
  });

  test('--kind rock-cut: rock in Hoek–Brown, its strengths taken at each base, no warning', () => {
    const printed = run(['init', '--kind', 'rock-cut', '-']);
    expect(printed.out).toMatch(/strength: \{ model: hoek-brown, intactStrength: 10 MPa, gsi: 30/);
    const a = run(['analyze', '-'], printed.out);
    expect(a.code).toBe(0);
    expect(a.out).toMatch(/search: [\d,]+ trial circles/);
    expect(a.out).toMatch(
      /strengths taken at each slice base's stress, \w+ \(settled in \d+ solutions\): siltstone: c [\d.]+–[\d.]+ kPa, φ [\d.]+–[\d.]+° at σ′n \d+–\d+ kPa/,
    );
    expect(a.out).not.toMatch(/warning/);
  });

  test('never over an existing file without --force; - prints; an unknown kind is refused', () => {
    const file = join(dir, 'cut.yaml');
    const again = run(['init', '--kind', 'cut', file]);
    expect(again.code).toBe(1);
    expect(again.err).toMatch(/exists; give another name or --force/);
    expect(run(['init', '--kind', 'cut', file, '--force']).code).toBe(0);
    const printed = run(['init', '--kind', 'levee', '-']);
    expect(printed.out).toMatch(/^# A Scarpline section file/);
    expect(run(['analyze', '-'], printed.out).code).not.toBe(1);
    expect(run(['init', '--kind', 'dam']).code).toBe(1);
  });
});

describe('--help everywhere, with examples', () => {
  test.each(['analyze', 'batch', 'plot', 'init', 'validate'])(
    '%s --help shows an example and the exit status',
    (cmd) => {
      const r = run([cmd, '--help']);
      expect(r.code).toBe(0);
      expect(r.out).toMatch(new RegExp(`\\$ scarpline ${cmd} `));
      expect(r.out).toMatch(/Exit status: 0/);
    },
  );
});
