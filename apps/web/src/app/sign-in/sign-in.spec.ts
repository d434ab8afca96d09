import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { SignIn } from './sign-in';
import { apiTestProviders } from '../testing/api-testing';

describe('SignIn', () => {
  let backend: HttpTestingController;
  let router: Router;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [SignIn],
      providers: apiTestProviders(),
    });
    backend = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
  });

  afterEach(() => {
    backend.verify();
    sessionStorage.clear();
  });

  async function render(inputs: Record<string, string> = {}) {
    const fixture = TestBed.createComponent(SignIn);
    for (const [k, v] of Object.entries(inputs)) fixture.componentRef.setInput(k, v);
    await fixture.whenStable();
    return fixture;
  }

  function fill(el: HTMLElement, email: string, password: string): void {
    const inputs = el.querySelectorAll('input');
    inputs[0].value = email;
    inputs[0].dispatchEvent(new Event('input'));
    inputs[1].value = password;
    inputs[1].dispatchEvent(new Event('input'));
  }

  it('does not send an empty form, and says what is missing', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
    backend.expectNone('/api/v1/auth/login');
    expect(el.textContent).toContain('Enter your e-mail address.');
    expect(el.textContent).toContain('Enter your password.');
  });

  it('shows the API’s words when the password is wrong, and keeps the e-mail', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    fill(el, 'eng@x.example', 'wrong-one');
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    backend
      .expectOne('/api/v1/auth/login')
      .flush(
        { title: 'Unauthorized', status: 401, detail: 'Wrong e-mail or password.' },
        { status: 401, statusText: 'Unauthorized' },
      );
    await fixture.whenStable();
    expect(el.querySelector('[role=alert]')?.textContent).toContain('Wrong e-mail or password.');
    expect(el.querySelectorAll('input')[0].value).toBe('eng@x.example');
  });

  it('goes on to the page the user was sent from', async () => {
    const go = vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
    const fixture = await render({ next: '/batches/3' });
    const el = fixture.nativeElement as HTMLElement;
    fill(el, 'eng@x.example', 'right-one');
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    const req = backend.expectOne('/api/v1/auth/login');
    expect(req.request.body).toEqual({ email: 'eng@x.example', password: 'right-one' });
    req.flush({
      token: 'tok',
      tokenType: 'Bearer',
      expiresAt: new Date(Date.now() + 3600_000).toISOString(),
      user: { id: 3, email: 'eng@x.example', name: 'Eng', role: 'engineer' },
    });
    await fixture.whenStable();
    expect(go).toHaveBeenCalledWith('/batches/3');
  });

  it('never follows a next that leaves the app', async () => {
    const go = vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
    const fixture = await render({ next: 'https://elsewhere.example/' });
    const el = fixture.nativeElement as HTMLElement;
    fill(el, 'eng@x.example', 'right-one');
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    backend.expectOne('/api/v1/auth/login').flush({
      token: 'tok',
      tokenType: 'Bearer',
      expiresAt: new Date(Date.now() + 3600_000).toISOString(),
      user: { id: 3, email: 'eng@x.example', name: 'Eng', role: 'engineer' },
    });
    await fixture.whenStable();
    expect(go).toHaveBeenCalledWith('/projects');
  });

  it('offers a way to set a new password by mail', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    const link = el.querySelector<HTMLAnchorElement>('a[href="/forgot-password"]');
    expect(link?.textContent).toBe('Forgot your password?');
  });
});
