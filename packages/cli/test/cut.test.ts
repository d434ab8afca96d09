/**
 * `scarpline cut` and `scarpline batch` of a terrain job, on the demonstration terrain
 * (examples/terrain): the corridor written, run as a batch, and the no-data located.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse, stringify } from 'yaml';
import { ROOT, run } from './run';

const tmp = () => mkdtempSync(join(tmpdir(), 'scarpline-cut-'));
const EX = 'examples/terrain';

describe('scarpline cut', () => {
  test('a job file: a GeoJSON corridor of a section every 40 m, the header from its template', () => {
    const out = join(tmp(), 'wcb.geojson');
    const r = run(['cut', `${EX}/wendlecombe.terrain.yaml`, '-o', out]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/30 sections cut/);
    const c = JSON.parse(readFileSync(out, 'utf8'));
    expect(c.type).toBe('FeatureCollection');
    expect(c.scarpline).toMatchObject({ id: 'wcb-terrain', units: 'si' });
    expect(
      c.features.map((f: { properties: { station: number } }) => f.properties.station),
    ).toEqual(Array.from({ length: 30 }, (_, k) => 1000 + 40 * k));
    // 40 m either side every 2 m: 41 samples; the mudstone's top at each of them
    for (const f of c.features) {
      expect(f.geometry.coordinates).toHaveLength(41);
      expect(f.properties.offset).toBe(40);
      expect(f.properties.strata[1].material).toBe('mudstone');
      expect(f.properties.strata[1].elevation).toHaveLength(41);
    }
  });

  test('the options in place of a job file give the same sections', () => {
    const dir = tmp();
    const fromJob = join(dir, 'a.geojson');
    const fromOptions = join(dir, 'b.geojson');
    run(['cut', `${EX}/wendlecombe.terrain.yaml`, '-o', fromJob]);
    // the job's corridor settings in a file of their own
    const job = parse(readFileSync(join(ROOT, EX, 'wendlecombe.terrain.yaml'), 'utf8'));
    writeFileSync(join(dir, 'settings.yaml'), stringify(job.template));
    const r = run([
      'cut',
      ...['--terrain', `${EX}/wendlecombe-dem.tif`],
      ...['--alignment', `${EX}/wendlecombe-alignment.geojson`],
      ...['--every', '40', '--left', '40', '--right', '40', '--spacing', '2'],
      ...['--template', join(dir, 'settings.yaml')],
      ...['--stratum', 'weathered-mudstone', '--stratum', `mudstone=${EX}/wendlecombe-rock.tif`],
      ...['--water', '2', '-o', fromOptions],
    ]);
    expect(r.code).toBe(0);
    expect(readFileSync(fromOptions, 'utf8')).toBe(readFileSync(fromJob, 'utf8'));
  });

  test('no data at a sample: each located by station and offset, exit 1', () => {
    // the demonstration raster holds no data beyond about 78 m from the line
    const r = run([
      'cut',
      `${EX}/wendlecombe.terrain.yaml`,
      ...[
        '--left',
        '90',
        '--stations',
        '1400,1600',
        '--spacing',
        '5',
        '-o',
        join(tmp(), 'x.geojson'),
      ],
    ]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(
      /wendlecombe-dem\.tif: station 1400, offset -90 \(x [\d.]+, y [\d.]+\): error: no data at the sample/,
    );
    expect(r.err).toMatch(/station 1600, offset -90 /);
    expect(r.err).toMatch(/the sections could not be cut/);
    // leaving those stations out instead
    const skip = run([
      'cut',
      `${EX}/wendlecombe.terrain.yaml`,
      ...['--left', '90', '--stations', '1400,1600', '--skip-no-data'],
    ]);
    expect(skip.code).toBe(1);
    expect(skip.err).toMatch(/station 1400: warning: the station is left out/);
    expect(skip.err).toMatch(/no station could be cut/);
  });

  test('a station off the alignment: located by its place in the list, in the job file', () => {
    const r = run(['cut', `${EX}/wendlecombe.terrain.yaml`, '--stations', '1000,2500']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(
      /^examples\/terrain\/wendlecombe\.terrain\.yaml: stations\[1\]: error: station 2500 is off the alignment \(chainage 1000 to 2200\)$/m,
    );
  });

  test('a bad job file: each setting located', () => {
    const dir = tmp();
    const job = join(dir, 'bad.terrain.yaml');
    writeFileSync(
      job,
      'format: scarpline-terrain/1\nterrain: dem.tif\nalignment: a.geojson\nstations: { every: -5 }\nleft: 40\nright: wide\nspacing: 1\ntemplate: t.yaml\n',
    );
    const r = run(['cut', job]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/bad\.terrain\.yaml: stations\.every: error: expected a number above 0/);
    expect(r.err).toMatch(/bad\.terrain\.yaml: right: error: expected a number of 0 or more/);
  });
});

describe('scarpline batch of a terrain job', () => {
  test('cuts the sections, runs them like any batch, results.geojson carries the section lines', () => {
    const out = tmp();
    const r = run(['batch', `${EX}/wendlecombe.terrain.yaml`, '--out', out, '--no-svg']);
    // two natural slopes are below the required FS of 1.5: exit 2
    expect(r.code).toBe(2);
    expect(r.out).toMatch(
      /30 of 30 sections: meets the required FS: \d+, below the required FS: \d+/,
    );
    expect(r.out).not.toMatch(/input error: [1-9]/);
    const g = JSON.parse(readFileSync(join(out, 'results.geojson'), 'utf8'));
    const stations = g.features.filter(
      (f: { properties: { row: string } }) => f.properties.row === 'station',
    );
    expect(stations).toHaveLength(30);
    for (const f of stations) {
      expect(f.geometry.type).toBe('LineString');
      expect(f.geometry.coordinates).toHaveLength(41);
    }
    const results = JSON.parse(readFileSync(join(out, 'results.json'), 'utf8'));
    expect(results.caution).toMatch(/qualified/);
    expect(results.corridor.id).toBe('wcb-terrain');
  });
});
