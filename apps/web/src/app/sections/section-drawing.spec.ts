import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { SectionDrawing } from './section-drawing';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';

const SVG =
  '<svg xmlns="http://www.w3.org/2000/svg" width="1100" height="508" viewBox="0 0 1100 508">' +
  '<text x="24" y="28">wcb-main@1000</text><path class="slip" d="M0 0L10 10"/></svg>';

describe('SectionDrawing', () => {
  let fixture: ComponentFixture<SectionDrawing>;
  let backend: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SectionDrawing);
    fixture.componentRef.setInput('sectionId', 7);
    fixture.componentRef.setInput('version', '1:done');
    await fixture.whenStable();
  });

  afterEach(() => verifyAndReset(backend));

  const el = () => fixture.nativeElement as HTMLElement;

  it('asks for the plot as text, shows loading, then the svg inline', async () => {
    const req = backend.expectOne('/api/v1/sections/7/plot.svg');
    expect(req.request.method).toBe('GET');
    expect(req.request.responseType).toBe('text');
    expect(el().querySelector('[role="status"]')?.textContent).toContain('Drawing the section');
    expect(el().querySelector('[data-testid="section-drawing"]')).toBeNull();

    req.flush(SVG);
    await fixture.whenStable();
    const box = el().querySelector('[data-testid="section-drawing"]');
    const svg = box?.querySelector('svg');
    expect(svg).not.toBeNull();
    expect(svg?.getAttribute('viewBox')).toBe('0 0 1100 508');
    // trusted as our own server's markup: nothing stripped
    expect(svg?.querySelector('path.slip')).not.toBeNull();
    expect(box?.textContent).toContain('wcb-main@1000');
    expect(el().querySelector('[role="status"]')).toBeNull();
  });

  it('shows the problem on a 404 and asks again on retry', async () => {
    backend
      .expectOne('/api/v1/sections/7/plot.svg')
      .flush(JSON.stringify({ title: 'Not found', status: 404, detail: 'No such section.' }), {
        status: 404,
        statusText: 'Not Found',
      });
    await fixture.whenStable();
    const alert = el().querySelector('[role="alert"]');
    // the problem+json of the text request is read: its title and detail are shown
    expect(alert?.textContent).toContain('Not found');
    expect(alert?.textContent).toContain('No such section.');
    expect(el().querySelector('[data-testid="section-drawing"]')).toBeNull();

    (alert?.querySelector('button') as HTMLButtonElement).click();
    await fixture.whenStable();
    backend.expectOne('/api/v1/sections/7/plot.svg').flush(SVG);
    await fixture.whenStable();
    expect(el().querySelector('[data-testid="section-drawing"] svg')).not.toBeNull();
  });

  it('shows an error state on a 500', async () => {
    backend
      .expectOne('/api/v1/sections/7/plot.svg')
      .flush('boom', { status: 500, statusText: 'Internal Server Error' });
    await fixture.whenStable();
    expect(el().querySelector('[role="alert"]')?.textContent).toContain('Internal Server Error');
    expect(el().querySelector('[data-testid="section-drawing"]')).toBeNull();
  });

  it('fetches the drawing again when the run changes', async () => {
    backend.expectOne('/api/v1/sections/7/plot.svg').flush(SVG);
    await fixture.whenStable();
    fixture.componentRef.setInput('version', '2:done');
    await fixture.whenStable();
    backend.expectOne('/api/v1/sections/7/plot.svg').flush(SVG.replace('wcb-main@1000', 'run 2'));
    await fixture.whenStable();
    expect(el().querySelector('[data-testid="section-drawing"]')?.textContent).toContain('run 2');
  });

  it("downloads the server's PNG of the same case under the drawing's name as .png", async () => {
    fixture.componentRef.setInput('fileName', 'wcb-main_1000-run2.svg');
    fixture.componentRef.setInput('caseName', 'long term');
    await fixture.whenStable();
    // the first drawing's request gave way to the case's
    backend
      .match((r) => r.url === '/api/v1/sections/7/plot.svg')
      .at(-1)!
      .flush(SVG);
    await fixture.whenStable();
    const saved: { name: string; type: string }[] = [];
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      saved.push({ name: this.download, type: '' });
    });
    const created = vi.spyOn(URL, 'createObjectURL').mockImplementation((b) => {
      saved.push({ name: '', type: (b as Blob).type });
      return 'blob:png';
    });
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    const button = el().querySelector('[data-testid="download-png"]') as HTMLButtonElement;
    expect(button.disabled).toBe(false);
    button.click();
    await fixture.whenStable();
    const req = backend.expectOne('/api/v1/sections/7/plot.png?case=long%20term');
    expect(req.request.responseType).toBe('blob');
    expect(button.disabled).toBe(true); // while it is being made
    req.flush(new Blob([new Uint8Array([137, 80, 78, 71])], { type: 'image/png' }));
    await fixture.whenStable();
    expect(saved).toEqual([
      { name: '', type: 'image/png' },
      { name: 'wcb-main_1000-run2.png', type: '' },
    ]);
    expect(button.disabled).toBe(false);
    click.mockRestore();
    created.mockRestore();
  });

  it('says so when the PNG cannot be made', async () => {
    backend.expectOne('/api/v1/sections/7/plot.svg').flush(SVG);
    await fixture.whenStable();
    (el().querySelector('[data-testid="download-png"]') as HTMLButtonElement).click();
    backend
      .expectOne('/api/v1/sections/7/plot.png')
      .flush(new Blob(['boom']), { status: 503, statusText: 'Service Unavailable' });
    await fixture.whenStable();
    expect(el().querySelector('.sl-drawing-png-error')?.textContent).toContain(
      'Service Unavailable',
    );
  });

  it("fetches the section's report.pdf and saves it under the server's name", async () => {
    backend.expectOne('/api/v1/sections/7/plot.svg').flush(SVG);
    await fixture.whenStable();
    const saved: string[] = [];
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      saved.push(this.download);
    });
    vi.spyOn(URL, 'createObjectURL').mockImplementation(() => 'blob:pdf');
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    const button = el().querySelector<HTMLButtonElement>(
      '[data-testid="download-section-report"]',
    )!;
    expect(button.textContent).toContain('Report (PDF)');
    button.click();
    await fixture.whenStable();
    expect(button.disabled).toBe(true);
    expect(button.textContent).toContain('Preparing the report…');
    const req = backend.expectOne('/api/v1/sections/7/report.pdf');
    expect(req.request.responseType).toBe('blob');
    const name = 'wcb-main-1+000-run2-report-2026-12-02.pdf';
    req.flush(new Blob(['%PDF-1.7'], { type: 'application/pdf' }), {
      headers: { 'Content-Disposition': `attachment; filename="${name}"` },
    });
    await fixture.whenStable();
    expect(saved).toEqual([name]);
    expect(button.disabled).toBe(false);
    expect(button.textContent).toContain('Report (PDF)');
    vi.restoreAllMocks();
  });

  it("shows the report's problem when it cannot be made", async () => {
    backend.expectOne('/api/v1/sections/7/plot.svg').flush(SVG);
    await fixture.whenStable();
    el().querySelector<HTMLButtonElement>('[data-testid="download-section-report"]')!.click();
    const problem = { title: 'Conflict', status: 409, detail: 'Run 2 has no result yet.' };
    backend
      .expectOne('/api/v1/sections/7/report.pdf')
      .flush(new Blob([JSON.stringify(problem)], { type: 'application/problem+json' }), {
        status: 409,
        statusText: 'Conflict',
      });
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
    expect(el().querySelector('[data-testid="section-report-problem"]')?.textContent?.trim()).toBe(
      'The report could not be made: Conflict — Run 2 has no result yet.',
    );
    expect(
      el().querySelector<HTMLButtonElement>('[data-testid="download-section-report"]')!.disabled,
    ).toBe(false);
  });
});
