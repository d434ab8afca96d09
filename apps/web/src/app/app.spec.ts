import { TestBed } from '@angular/core/testing';
import { App } from './app';
import type { Role } from './core/models';
import { apiTestProviders } from './testing/api-testing';
import { signInAs } from './testing/sign-in-as';

async function shellAs(role: Role | null): Promise<HTMLElement> {
  if (role) signInAs(role);
  TestBed.configureTestingModule({
    imports: [App],
    providers: apiTestProviders(),
  });
  const fixture = TestBed.createComponent(App);
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

function links(el: HTMLElement): string[] {
  return [...el.querySelectorAll('nav a')].map((a) => a.textContent.replace(/\s+/g, ' ').trim());
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
