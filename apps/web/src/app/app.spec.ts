import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { App } from './app';
import type { Role } from './core/models';
import { apiTestProviders } from './testing/api-testing';
import { signInAs } from './testing/sign-in-as';

async function shellAs(role: Role | null): Promise<HTMLElement> {
  if (role) signInAs(role);
  TestBed.configureTestingModule({
    imports: [App],
    providers: [
      ...apiTestProviders(),
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
    ],
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

  it('shows no page links until an invitation’s password is replaced', async () => {
    signInAs('admin', { mustChangePassword: true });
    expect(links(await shellAs(null))).toEqual([]);
  });

  it('shows an engineer and a viewer only the projects', async () => {
    expect(links(await shellAs('engineer'))).toEqual(['folder_open Projects']);
    TestBed.resetTestingModule();
    sessionStorage.clear();
    expect(links(await shellAs('viewer'))).toEqual(['folder_open Projects']);
  });

  it('offers everyone signed in to change their password, in the user menu', async () => {
    signInAs('viewer');
    TestBed.configureTestingModule({
      imports: [App],
      providers: [
        ...apiTestProviders(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    const fixture = TestBed.createComponent(App);
    await fixture.whenStable();
    const menu =
      await TestbedHarnessEnvironment.documentRootLoader(fixture).getHarness(MatMenuHarness);
    await menu.open();
    const items = await Promise.all((await menu.getItems()).map((i) => i.getText()));
    expect(items).toContain('passwordChange password');
    const link = document.querySelector<HTMLAnchorElement>('a[href="/account/password"]');
    expect(link?.textContent).toContain('Change password');
    document.querySelectorAll('.cdk-overlay-container').forEach((e) => e.remove());
  });
});
