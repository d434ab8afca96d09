import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router } from '@angular/router';
import { Auth } from '../core/auth';
import { ChangePassword } from './change-password';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';

describe('ChangePassword', () => {
  let backend: HttpTestingController;

  function setup(mustChangePassword = false) {
    signInAs('engineer', { id: 3, email: 'eng@x.example', name: 'Eng', mustChangePassword });
    TestBed.configureTestingModule({ imports: [ChangePassword], providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
  }

  afterEach(() => verifyAndReset(backend));

  async function render(inputs: Record<string, string> = {}) {
    const fixture = TestBed.createComponent(ChangePassword);
    for (const [k, v] of Object.entries(inputs)) fixture.componentRef.setInput(k, v);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const field = (label: string) =>
      loader.getHarness(
        MatInputHarness.with({
          ancestor: `mat-form-field:has(mat-label)`,
          selector: `[formControlName=${label}]`,
        }),
      );
    return { fixture, loader, el: fixture.nativeElement as HTMLElement, field };
  }

  async function fill(
    r: Awaited<ReturnType<typeof render>>,
    current: string,
    fresh: string,
    repeat = fresh,
  ) {
    await (await r.field('current')).setValue(current);
    await (await r.field('password')).setValue(fresh);
    await (await r.field('repeat')).setValue(repeat);
    await (await r.loader.getHarness(MatButtonHarness.with({ text: 'Change password' }))).click();
  }

  it('labels its three fields for a password manager and a screen reader', async () => {
    setup();
    const r = await render();
    const labels = await Promise.all(
      (await r.loader.getAllHarnesses(MatFormFieldHarness)).map((f) => f.getLabel()),
    );
    expect(labels).toEqual(['Current password', 'New password', 'New password again']);
    const inputs = [...r.el.querySelectorAll('input')].map((i) => i.getAttribute('autocomplete'));
    expect(inputs).toEqual(['current-password', 'new-password', 'new-password']);
  });

  it('sends nothing while the new password is too short or the two differ, and says why', async () => {
    setup();
    const r = await render();
    await fill(r, 'old-password-1', 'short');
    expect(r.el.textContent).toContain('At least 8 characters.');
    await fill(r, 'old-password-1', 'long-enough-1', 'long-enough-2');
    expect(r.el.querySelector('[data-testid=different]')?.textContent).toContain('differ');
    backend.expectNone('/api/v1/me/password');
  });

  it('sends the change, keeps the user the API answers, and says it is done', async () => {
    setup();
    const r = await render();
    await fill(r, 'old-password-1', 'new-password-22');
    const req = backend.expectOne('/api/v1/me/password');
    expect(req.request.body).toEqual({
      currentPassword: 'old-password-1',
      newPassword: 'new-password-22',
    });
    req.flush({
      id: 3,
      email: 'eng@x.example',
      name: 'Eng',
      role: 'engineer',
      mustChangePassword: false,
    });
    await r.fixture.whenStable();
    expect(r.el.querySelector('[data-testid=password-changed]')?.textContent).toContain(
      'Your password is changed.',
    );
    expect(await (await r.field('current')).getValue()).toBe('');
  });

  it('shows the API’s words for a wrong current password', async () => {
    setup();
    const r = await render();
    await fill(r, 'wrong-password', 'new-password-22');
    backend
      .expectOne('/api/v1/me/password')
      .flush(
        { title: 'Forbidden', status: 403, detail: 'The current password is wrong.' },
        { status: 403, statusText: 'Forbidden' },
      );
    await r.fixture.whenStable();
    expect(r.el.querySelector('[role=alert]')?.textContent).toContain(
      'The current password is wrong.',
    );
  });

  it('after an invitation: says why, and goes on to where the user was going once changed', async () => {
    setup(true);
    const go = vi.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    const r = await render({ next: '/batches/4' });
    expect(r.el.querySelector('[data-testid=must-change]')?.textContent).toContain(
      'You signed in with the password you were sent.',
    );
    await fill(r, 'mailed-password', 'my-own-password-1');
    backend.expectOne('/api/v1/me/password').flush({
      id: 3,
      email: 'eng@x.example',
      name: 'Eng',
      role: 'engineer',
      mustChangePassword: false,
    });
    await r.fixture.whenStable();
    expect(go).toHaveBeenCalledWith('/batches/4');
    expect(TestBed.inject(Auth).mustChangePassword()).toBe(false);
  });
});
