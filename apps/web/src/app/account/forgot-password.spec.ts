import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { ForgotPassword } from './forgot-password';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';

describe('ForgotPassword', () => {
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ imports: [ForgotPassword], providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => verifyAndReset(backend));

  async function render() {
    const fixture = TestBed.createComponent(ForgotPassword);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    return { fixture, loader, el: fixture.nativeElement as HTMLElement };
  }

  it('sends nothing without an e-mail address', async () => {
    const r = await render();
    await (await r.loader.getHarness(MatButtonHarness.with({ text: 'Send the link' }))).click();
    backend.expectNone('/api/v1/password-resets');
    expect(r.el.textContent).toContain('Enter your e-mail address.');
  });

  it('asks for the link and says the same whatever the address', async () => {
    const r = await render();
    await (await r.loader.getHarness(MatInputHarness)).setValue('eng@x.example');
    await (await r.loader.getHarness(MatButtonHarness.with({ text: 'Send the link' }))).click();
    const req = backend.expectOne('/api/v1/password-resets');
    expect(req.request.body).toEqual({ email: 'eng@x.example' });
    req.flush(
      { detail: 'If an account has this address, a link is on its way.', expiresInMinutes: 60 },
      { status: 202, statusText: 'Accepted' },
    );
    await r.fixture.whenStable();
    const said = r.el.querySelector('[data-testid=reset-asked]')?.textContent ?? '';
    expect(said).toContain('If an account has the address eng@x.example');
    expect(said).toContain('within 60 minutes');
  });

  it('shows the API’s words when it refuses (too many requests)', async () => {
    const r = await render();
    await (await r.loader.getHarness(MatInputHarness)).setValue('eng@x.example');
    await (await r.loader.getHarness(MatButtonHarness.with({ text: 'Send the link' }))).click();
    backend
      .expectOne('/api/v1/password-resets')
      .flush(
        { title: 'Too many requests', status: 429, detail: 'Wait and try again.' },
        { status: 429, statusText: 'Too Many Requests' },
      );
    await r.fixture.whenStable();
    expect(r.el.querySelector('[role=alert]')?.textContent).toContain('Wait and try again.');
  });
});
