import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { Router } from '@angular/router';
import { TerrainSubmit, terrainJob, type TerrainForm } from './terrain-submit';
import { apiTestProviders } from '../testing/api-testing';

const dem = new File([new Uint8Array([73, 73, 42, 0])], 'dem.tif');
const line = new File(
  ['{"type": "LineString", "coordinates": [[0, 0], [100, 0]]}'],
  'line.geojson',
);
const settings = new File(['id: wcb\nunits: si\ntemplate: {}\n'], 'settings.yaml');

describe('terrainJob', () => {
  const form: TerrainForm = {
    terrain: dem,
    alignment: line,
    settings,
    rock: null,
    topMaterial: '',
    rockMaterial: '',
    start: '1000',
    every: '20',
    left: '30',
    right: '45.5',
    spacing: '1',
    waterDepth: '',
  };

  it('is a terrain job naming the files, with the numbers as numbers', () => {
    expect(terrainJob(form)).toBe(
      [
        'format: scarpline-terrain/1',
        'terrain: "dem.tif"',
        'alignment: "line.geojson"',
        'start: 1000',
        'stations: { every: 20 }',
        'left: 30',
        'right: 45.5',
        'spacing: 1',
        'template: "settings.yaml"',
        '',
      ].join('\n'),
    );
  });

  it('adds the lower stratum by its raster and the groundwater depth; keeps a bad number as typed', () => {
    const rock = new File(['x'], 'rock top.tif');
    const job = terrainJob({
      ...form,
      rock,
      topMaterial: 'clay',
      rockMaterial: 'mudstone',
      waterDepth: '2.5',
      spacing: 'fine',
    });
    expect(job).toContain(
      'strata:\n  - material: "clay"\n  - { material: "mudstone", raster: "rock top.tif" }\n',
    );
    expect(job).toContain('water: { depth: 2.5 }\n');
    // the API names the setting: "spacing: expected a number above 0"
    expect(job).toContain('spacing: "fine"\n');
  });
});

describe('TerrainSubmit', () => {
  let fixture: ComponentFixture<TerrainSubmit>;
  let backend: HttpTestingController;
  let el: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(TerrainSubmit);
    fixture.componentRef.setInput('projectId', 3);
    await fixture.whenStable();
    el = fixture.nativeElement as HTMLElement;
  });

  afterEach(() => backend.verify());

  async function choose(testid: string, file: File): Promise<void> {
    const input = el.querySelector(`[data-testid=${testid}]`) as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [file], configurable: true });
    input.dispatchEvent(new Event('change'));
    await fixture.whenStable();
  }

  async function type(testid: string, value: string): Promise<void> {
    const input = el.querySelector(`[data-testid=${testid}]`) as HTMLInputElement;
    input.value = value;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  const button = () => el.querySelector('[data-testid=terrain-submit]') as HTMLButtonElement;

  it('sends the job and its files to /projects/3/terrain, then opens the batch', async () => {
    expect(button().disabled).toBe(true);
    await choose('terrain-raster', dem);
    await choose('terrain-alignment', line);
    await choose('terrain-settings', settings);
    await type('terrain-every', '25');
    await type('terrain-water', '2');
    expect(button().disabled).toBe(false);
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    button().click();
    await fixture.whenStable();
    const req = backend.expectOne('/api/v1/projects/3/terrain');
    expect(req.request.method).toBe('POST');
    const body = req.request.body as FormData;
    const job = body.get('job') as string;
    for (const l of [
      'terrain: "dem.tif"',
      'alignment: "line.geojson"',
      'stations: { every: 25 }',
      'left: 40',
      'right: 40',
      'spacing: 1',
      'water: { depth: 2 }',
    ])
      expect(job).toContain(`${l}\n`);
    expect((body.getAll('files') as File[]).map((f) => f.name)).toEqual([
      'dem.tif',
      'line.geojson',
      'settings.yaml',
    ]);
    req.flush(
      { id: 12, name: 'wcb', progress: { total: 5 } },
      { status: 201, statusText: 'Created' },
    );
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith(['/batches', 12]);
  });

  it('lists the located errors: a sample without a value by station and offset', async () => {
    await choose('terrain-raster', dem);
    await choose('terrain-alignment', line);
    await choose('terrain-settings', settings);
    button().click();
    await fixture.whenStable();
    backend.expectOne('/api/v1/projects/3/terrain').flush(
      {
        type: 'https://scarpline.example/problems/invalid-input',
        title: 'Invalid input',
        status: 422,
        detail: '1 error in the terrain input.',
        errors: [
          {
            severity: 'error',
            file: 'dem.tif',
            station: 1040,
            offset: -12.5,
            code: 'no-data',
            message: 'no data at the sample (a pixel of no data next to it)',
          },
        ],
      },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await fixture.whenStable();
    const items = Array.from(el.querySelectorAll('[data-testid=terrain-errors] li'));
    expect(items).toHaveLength(1);
    expect(items[0].textContent).toContain('dem.tif, station 1040, offset -12.5');
    expect(items[0].textContent).toContain('no data at the sample');
    expect(el.textContent).toContain('1 error in the terrain input.');
  });

  it('shows each file chosen by its name and size, each picker labelled; a file removed is asked for again', async () => {
    const groups = Array.from(el.querySelectorAll('sl-file-choice [role=group]'));
    const label = (g: Element) =>
      el.querySelector(`[id="${g.getAttribute('aria-labelledby')}"]`)?.textContent?.trim();
    expect(groups.map(label)).toEqual([
      'Terrain raster (.tif)',
      'Alignment (.geojson)',
      'Corridor settings (.yaml, .json)',
      'Its top (.tif)',
    ]);
    await choose('terrain-raster', dem);
    await choose('terrain-alignment', line);
    await choose('terrain-settings', settings);
    const chosen = Array.from(el.querySelectorAll('sl-file-choice .file')).map((f) =>
      f.textContent?.replace(/\s+/g, ' ').trim(),
    );
    expect(chosen).toEqual([
      'dem.tif 4 B',
      'line.geojson 57 B',
      'settings.yaml 31 B',
      'No file chosen',
    ]);
    expect(button().disabled).toBe(false);
    (el.querySelector('button[aria-label="Remove line.geojson"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(button().disabled).toBe(true);
  });
});
