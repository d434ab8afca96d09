import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { Router } from '@angular/router';
import { BatchSubmit, detectPasted, lineRange } from './batch-submit';
import { apiTestProviders } from '../testing/api-testing';

const YAML = [
  'format: scarpline-section/1',
  'id: cut-1',
  'materials:',
  '  clay:',
  '    unitWeight: heavy',
  'ground: [[0, 10], [20, 10]]',
].join('\n');

const PROBLEM_422 = {
  type: 'https://scarpline.example/problems/invalid-input',
  title: 'Invalid input',
  status: 422,
  detail: '2 errors in the input.',
  errors: [
    {
      severity: 'error',
      file: 'pasted.yaml',
      line: 5,
      column: 17,
      path: 'materials.clay.unitWeight',
      code: 'type',
      message: 'expected a number, got the text "heavy"',
    },
    {
      severity: 'error',
      file: 'pasted.yaml',
      line: 6,
      column: 1,
      path: 'ground',
      code: 'minItems',
      message: 'needs at least 3 points',
    },
  ],
};

describe('BatchSubmit', () => {
  let fixture: ComponentFixture<BatchSubmit>;
  let backend: HttpTestingController;
  let el: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(BatchSubmit);
    fixture.componentRef.setInput('id', '3');
    await fixture.whenStable();
    backend
      .expectOne('/api/v1/projects/3')
      .flush({ id: 3, name: 'Wendlecombe', description: null, createdAt: '' });
    el = fixture.nativeElement as HTMLElement;
  });

  afterEach(() => backend.verify());

  async function paste(text: string): Promise<HTMLTextAreaElement> {
    const ta = el.querySelector('[data-testid=paste-input]') as HTMLTextAreaElement;
    ta.value = text;
    ta.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    return ta;
  }

  async function choose(files: File[]): Promise<void> {
    const input = el.querySelector('[data-testid=file-input]') as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: files, configurable: true });
    input.dispatchEvent(new Event('change'));
    await fixture.whenStable();
  }

  async function submit(): Promise<void> {
    (el.querySelector('[data-testid=submit-button]') as HTMLButtonElement).click();
    await fixture.whenStable();
  }

  it('uploads pasted YAML as pasted.yaml, lists the 422 located errors and keeps the text', async () => {
    const ta = await paste(YAML);
    expect(el.querySelector('.detected')?.textContent?.replace(/\s+/g, ' ').trim()).toBe(
      'Read as YAML: uploaded as pasted.yaml.',
    );
    await submit();
    const req = backend.expectOne('/api/v1/projects/3/uploads');
    const files = (req.request.body as FormData).getAll('files') as File[];
    expect(files.map((f) => f.name)).toEqual(['pasted.yaml']);
    expect(await files[0].text()).toBe(YAML);
    req.flush(PROBLEM_422, { status: 422, statusText: 'Unprocessable Entity' });
    await fixture.whenStable();

    const items = Array.from(el.querySelectorAll('[data-testid=located-errors] li'));
    expect(items).toHaveLength(2);
    expect(items[0].textContent).toContain('line 5:17');
    expect(items[0].textContent).toContain('materials.clay.unitWeight');
    expect(items[0].textContent).toContain('expected a number, got the text "heavy"');
    expect(items[1].textContent).toContain('needs at least 3 points');
    // nothing the user gave is lost
    expect(ta.value).toBe(YAML);
  });

  it('selects the line of an error in the textarea when it is clicked', async () => {
    const ta = await paste(YAML);
    await submit();
    backend
      .expectOne('/api/v1/projects/3/uploads')
      .flush(PROBLEM_422, { status: 422, statusText: 'Unprocessable Entity' });
    await fixture.whenStable();
    (el.querySelector('[data-testid=located-errors] li button') as HTMLButtonElement).click();
    expect(ta.value.slice(ta.selectionStart, ta.selectionEnd)).toBe('    unitWeight: heavy');
    expect(document.activeElement).toBe(ta);
  });

  it('posts a pasted JSON batch as the batch itself, text unchanged', async () => {
    const json = '{\n  "format": "scarpline-batch/1",\n  "id": "wcb-x",\n  "sections": []\n}';
    await paste(json);
    await submit();
    const req = backend.expectOne('/api/v1/projects/3/batches');
    expect(req.request.body).toBe(json);
    expect(req.request.headers.get('Content-Type')).toBe('application/json');
    req.flush(
      {
        ...PROBLEM_422,
        errors: [{ ...PROBLEM_422.errors[0], file: 'batch.json', line: 4, column: 3 }],
      },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await fixture.whenStable();
    expect(el.querySelectorAll('[data-testid=located-errors] li')).toHaveLength(1);
    // an error in batch.json points into the pasted text: it can select its line
    expect(el.querySelector('[data-testid=located-errors] li button')).not.toBeNull();
  });

  it('shows the chosen files with their sizes and sends them all as multipart', async () => {
    const a = new File(['format: scarpline-section/1\nid: a\n'], 'a.yaml');
    const b = new File(['format: scarpline-section/1\nid: b\n'], 'b.yml');
    const bad = new File(['x'], 'notes.txt');
    await choose([a, b, bad]);
    const listed = Array.from(el.querySelectorAll('.file-list li')).map(
      (li) => li.textContent ?? '',
    );
    expect(listed).toHaveLength(2);
    expect(listed[0]).toContain('a.yaml');
    expect(listed[0]).toContain(`${a.size} B`);
    expect(el.textContent).toContain(
      'Not added (only .yaml, .yml, .json, .geojson, .xml): notes.txt',
    );
    expect(el.querySelector('.send')?.textContent).toContain('2 files');

    await submit();
    const req = backend.expectOne('/api/v1/projects/3/uploads');
    const files = (req.request.body as FormData).getAll('files') as File[];
    expect(files.map((f) => f.name)).toEqual(['a.yaml', 'b.yml']);
    expect(await files[1].text()).toBe('format: scarpline-section/1\nid: b\n');
    req.flush(
      { ...PROBLEM_422, errors: [{ ...PROBLEM_422.errors[0], file: 'b.yml', line: 2 }] },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await fixture.whenStable();
    const err = el.querySelector('[data-testid=located-errors] li');
    expect(err?.textContent).toContain('b.yml:2:17');
    // the files stay chosen after the error
    expect(el.querySelectorAll('.file-list li')).toHaveLength(2);
  });

  it('shows a problem without located errors, and goes to the batch on success', async () => {
    const router = TestBed.inject(Router);
    const nav = vi.spyOn(router, 'navigate').mockResolvedValue(true);
    await paste(YAML);
    await submit();
    backend.expectOne('/api/v1/projects/3/uploads').flush(
      {
        title: 'Content too large',
        status: 413,
        detail: 'An uploaded file is larger than allowed.',
      },
      { status: 413, statusText: 'Payload Too Large' },
    );
    await fixture.whenStable();
    expect(el.querySelector('[role=alert]')?.textContent).toContain(
      'An uploaded file is larger than allowed.',
    );
    expect(nav).not.toHaveBeenCalled();

    await submit();
    backend.expectOne('/api/v1/projects/3/uploads').flush({
      id: 42,
      name: 'cut-1',
      progress: { total: 1 },
      warnings: [],
    });
    await fixture.whenStable();
    expect(nav).toHaveBeenCalledWith(['/batches', 42]);
  });

  it('takes LandXML cross-sections with their settings, and a lon/lat GeoJSON corridor, as files', async () => {
    const nav = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const xml = new File(
      ['<?xml version="1.0"?>\n<LandXML version="1.2"><Alignments/></LandXML>\n'],
      'wendlecombe-cut.xml',
    );
    const settings = new File(['id: wcb-cut\nunits: si\n'], 'wendlecombe-cut.yaml');
    const lonLat = new File(
      ['{"type": "FeatureCollection", "scarpline": {"crs": "EPSG:32630"}, "features": []}'],
      'map.geojson',
    );
    await choose([xml, settings, lonLat]);
    expect(el.textContent).not.toContain('Not added');
    const listed = Array.from(el.querySelectorAll('.file-list li')).map(
      (li) => li.textContent ?? '',
    );
    expect(listed).toHaveLength(3);
    expect(listed[0]).toContain('LandXML');
    expect(listed[2]).toContain('GeoJSON');
    expect(el.querySelector('input[type=file]')?.getAttribute('accept')).toContain('.xml');
    await submit();
    const req = backend.expectOne('/api/v1/projects/3/uploads');
    const files = (req.request.body as FormData).getAll('files') as File[];
    expect(files.map((f) => f.name)).toEqual([
      'wendlecombe-cut.xml',
      'wendlecombe-cut.yaml',
      'map.geojson',
    ]);
    req.flush({ id: 7, name: 'wcb-cut', progress: { total: 6 }, warnings: [] });
    await fixture.whenStable();
    expect(nav).toHaveBeenCalledWith(['/batches', 7]);
  });

  it('tells what pasted text is', () => {
    expect(detectPasted('<?xml version="1.0"?>\n<LandXML/>')).toMatchObject({
      kind: 'landxml',
      fileName: 'pasted.xml',
    });
    expect(detectPasted('{"type": "FeatureCollection", "features": []}').fileName).toBe(
      'pasted.geojson',
    );
    expect(detectPasted('{"format": "scarpline-batch/1", "id": "x"}').kind).toBe('batch');
    expect(detectPasted('{"format": "scarpline-section/1"}').fileName).toBe('pasted.json');
    expect(detectPasted('{"format": "scarpline-batch/1", ').fileName).toBe('pasted.json');
    expect(detectPasted('id: a\n').fileName).toBe('pasted.yaml');
    expect(lineRange('a\nbb\nccc', 2)).toEqual([2, 4]);
    expect(lineRange('a\nbb\nccc', 3)).toEqual([5, 8]);
  });
});
