import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { ActivatedRoute } from '@angular/router';
import { ResetPassword, tokenOf } from './reset-password';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';

const TOKEN = 'slr_abcdefghijklmnopqrstuvwxyz012345';

describe('ResetPassword', () => {
  let backend: HttpTestingController;

  function setup(fragment: string | null) {
    TestBed.configureTestingModule({
      imports: [ResetPassword],
      providers: [
        ...apiTestProviders(),
        { provide: ActivatedRoute, useValue: { snapshot: { fragment } } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  }

  afterEach(() => verifyAndReset(backend));

  async function render() {
    const fixture = TestBed.createComponent(ResetPassword);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const inputs = () => loader.getAllHarnesses(MatInputHarness);
    const submit = async () =>
      (await loader.getHarness(MatButtonHarness.with({ text: 'Set the password' }))).click();
    return { fixture, loader, el: fixture.nativeElement as HTMLElement, inputs, submit };
  }

  it('reads the token from the fragment only, and only one of its form', () => {
    setup(null);
    expect(tokenOf(`token=${TOKEN}`)).toBe(TOKEN);
    expect(tokenOf(null)).toBeNull();
    expect(tokenOf('token=')).toBeNull();
    expect(tokenOf('token=<script>')).toBeNull();
  });

  it('without a token: says the link is needed, and where to ask for another', async () => {
    setup(null);
    const r = await render();
    expect(r.el.querySelector('[data-testid=no-token]')?.textContent).toContain(
      'needs the whole link from the mail',
    );
    expect(r.el.querySelector('a[href="/forgot-password"]')).not.toBeNull();
  });

  it('sets the password with the token, then offers to sign in', async () => {
    setup(`token=${TOKEN}`);
    const r = await render();
    const [password, repeat] = await r.inputs();
    await password.setValue('a-new-password-9');
    await repeat.setValue('a-new-password-9');
    await r.submit();
    const req = backend.expectOne('/api/v1/password-resets/confirm');
    expect(req.request.body).toEqual({ token: TOKEN, password: 'a-new-password-9' });
    req.flush({ email: 'eng@x.example' });
    await r.fixture.whenStable();
    expect(r.el.querySelector('[data-testid=reset-done]')?.textContent).toContain(
      'Sign in as eng@x.example',
    );
  });

  it('a used or expired link: the API’s words and a way to a new link', async () => {
    setup(`token=${TOKEN}`);
    const r = await render();
    const [password, repeat] = await r.inputs();
    await password.setValue('a-new-password-9');
    await repeat.setValue('a-new-password-9');
    await r.submit();
    backend
      .expectOne('/api/v1/password-resets/confirm')
      .flush(
        { title: 'Bad request', status: 400, detail: 'This link … is not valid.' },
        { status: 400, statusText: 'Bad Request' },
      );
    await r.fixture.whenStable();
    expect(r.el.querySelector('[role=alert]')?.textContent).toContain('is not valid');
    expect(r.el.querySelector('a[href="/forgot-password"]')).not.toBeNull();
  });

  it('sends nothing when the two passwords differ', async () => {
    setup(`token=${TOKEN}`);
    const r = await render();
    const [password, repeat] = await r.inputs();
    await password.setValue('a-new-password-9');
    await repeat.setValue('another-password-9');
    await r.submit();
    backend.expectNone('/api/v1/password-resets/confirm');
    expect(r.el.querySelector('[data-testid=different]')).not.toBeNull();
  });
});
