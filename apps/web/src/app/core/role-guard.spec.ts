import { TestBed } from '@angular/core/testing';
import { Router, UrlTree, type ActivatedRouteSnapshot } from '@angular/router';
import { Auth } from './auth';
import { roleGuard } from './role-guard';
import { apiTestProviders } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';

function run(guard: ReturnType<typeof roleGuard>, url: string): boolean | UrlTree {
  return TestBed.runInInjectionContext(
    () => guard({} as ActivatedRouteSnapshot, { url, root: {} as never }) as boolean | UrlTree,
  );
}

describe('roleGuard', () => {
  afterEach(() => sessionStorage.clear());

  function setup(): Router {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    return TestBed.inject(Router);
  }

  it('sends a visitor who is not signed in to sign-in, coming back after', () => {
    const router = setup();
    const out = run(roleGuard('admin'), '/admin/users');
    expect(out instanceof UrlTree).toBe(true);
    expect(router.serializeUrl(out as UrlTree)).toBe('/sign-in?next=%2Fadmin%2Fusers');
  });

  it('lets a user in whose role is listed', () => {
    signInAs('reviewer');
    setup();
    expect(run(roleGuard('admin', 'reviewer'), '/reviews')).toBe(true);
  });

  it('sends a user whose role is not listed to the not-allowed page', () => {
    signInAs('viewer');
    const router = setup();
    const out = run(roleGuard('admin'), '/admin/users');
    expect(router.serializeUrl(out as UrlTree)).toBe('/not-allowed?from=%2Fadmin%2Fusers');
  });

  it('sends a user with an invitation’s password to change it first, coming back after', () => {
    signInAs('engineer', { mustChangePassword: true });
    const router = setup();
    const out = run(roleGuard('engineer'), '/projects/3');
    expect(router.serializeUrl(out as UrlTree)).toBe('/account/password?next=%2Fprojects%2F3');
    expect(run(roleGuard(), '/account/password?next=%2Fprojects%2F3')).toBe(true);
  });

  it('lets the same user anywhere once the password is their own', () => {
    signInAs('engineer', { mustChangePassword: false });
    setup();
    expect(run(roleGuard('engineer'), '/projects/3')).toBe(true);
  });

  it('forgets a session whose token has expired', () => {
    signInAs('admin', {}, { expiresAt: new Date(Date.now() - 1000).toISOString() });
    setup();
    expect(TestBed.inject(Auth).signedIn()).toBe(false);
    expect(run(roleGuard(), '/projects') instanceof UrlTree).toBe(true);
  });
});
