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
});
