import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { App } from './app';
import type { Role } from './core/models';

async function shellAs(role: Role | null): Promise<HTMLElement> {
  if (role) {
    sessionStorage.setItem(
      'scarpline.session',
      JSON.stringify({
        token: 't',
        expiresAt: new Date(Date.now() + 3600_000).toISOString(),
        user: { id: 1, email: `${role}@x.example`, name: `The ${role}`, role },
      }),
    );
  }
  TestBed.configureTestingModule({
    imports: [App],
    providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
  });
  const fixture = TestBed.createComponent(App);
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

function links(el: HTMLElement): string[] {
  return [...el.querySelectorAll('nav a')].map((a) => a.textContent!.replace(/\s+/g, ' ').trim());
}

describe('App shell', () => {
  afterEach(() => sessionStorage.clear());

  it('carries the name Scarpline and no links before sign-in', async () => {
    const el = await shellAs(null);
    expect(el.querySelector('.name')?.textContent).toBe('Scarpline');
    expect(links(el)).toEqual([]);
  });

  it('shows an admin every page', async () => {
    const el = await shellAs('admin');
    expect(links(el)).toEqual([
      'folder_open Projects',
      'fact_check To review',
      'group Users',
      'key API tokens',
    ]);
    expect(el.querySelector('[data-testid=role]')?.textContent).toBe('admin');
  });

  it('shows a reviewer the review queue but not the admin pages', async () => {
    expect(links(await shellAs('reviewer'))).toEqual([
      'folder_open Projects',
      'fact_check To review',
    ]);
  });

  it('shows an engineer and a viewer only the projects', async () => {
    expect(links(await shellAs('engineer'))).toEqual(['folder_open Projects']);
    TestBed.resetTestingModule();
    sessionStorage.clear();
    expect(links(await shellAs('viewer'))).toEqual(['folder_open Projects']);
  });
});
