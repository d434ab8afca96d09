import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { Auth } from './auth';
import { authInterceptor } from './auth-interceptor';

describe('authInterceptor and Auth', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let auth: Auth;
  let router: Router;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    auth = TestBed.inject(Auth);
    router = TestBed.inject(Router);
  });

  afterEach(() => {
    backend.verify();
    sessionStorage.clear();
  });

  function signIn(): void {
    auth.signIn('eng@x.example', 'pw').subscribe();
    backend.expectOne('/api/v1/auth/login').flush({
      token: 'tok-1',
      tokenType: 'Bearer',
      expiresAt: new Date(Date.now() + 3600_000).toISOString(),
      user: { id: 3, email: 'eng@x.example', name: 'Eng', role: 'engineer' },
    });
  }

  it('keeps the token for the session and sends it to the API', () => {
    signIn();
    expect(auth.user()?.role).toBe('engineer');
    expect(sessionStorage.getItem('scarpline.session')).toContain('tok-1');
    http.get('/api/v1/projects').subscribe();
    const req = backend.expectOne('/api/v1/projects');
    expect(req.request.headers.get('Authorization')).toBe('Bearer tok-1');
    req.flush([]);
  });

  it('does not send the token anywhere but the API', () => {
    signIn();
    http.get('/assets/x.json').subscribe();
    const req = backend.expectOne('/assets/x.json');
    expect(req.request.headers.has('Authorization')).toBe(false);
    req.flush({});
  });

  it('on a 401 forgets the session and returns to sign-in with the way back', () => {
    signIn();
    const nav = vi.spyOn(router, 'navigate').mockResolvedValue(true);
    let failed = false;
    http.get('/api/v1/batches/4').subscribe({ error: () => (failed = true) });
    backend
      .expectOne('/api/v1/batches/4')
      .flush({ title: 'Unauthorized', status: 401 }, { status: 401, statusText: 'Unauthorized' });
    expect(failed).toBe(true);
    expect(auth.signedIn()).toBe(false);
    expect(sessionStorage.getItem('scarpline.session')).toBeNull();
    expect(nav).toHaveBeenCalledWith(['/sign-in'], {
      queryParams: { next: '/', expired: 1 },
    });
  });

  it('a wrong password is an error of the form, not a redirect', () => {
    const nav = vi.spyOn(router, 'navigate');
    let message = '';
    auth.signIn('eng@x.example', 'nope').subscribe({
      error: (e: { error: { detail: string } }) => (message = e.error.detail),
    });
    backend
      .expectOne('/api/v1/auth/login')
      .flush(
        { title: 'Unauthorized', status: 401, detail: 'Wrong e-mail or password.' },
        { status: 401, statusText: 'Unauthorized' },
      );
    expect(message).toBe('Wrong e-mail or password.');
    expect(nav).not.toHaveBeenCalled();
  });

  it('sign-out revokes the token on the server and forgets it', () => {
    signIn();
    vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
    auth.signOut();
    const req = backend.expectOne('/api/v1/auth/logout');
    expect(req.request.headers.get('Authorization')).toBe('Bearer tok-1');
    req.flush(null);
    expect(auth.signedIn()).toBe(false);
  });
});
