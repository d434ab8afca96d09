import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { ApiToken } from './admin-api';
import { TokenAdmin, tokenState } from './token-admin';
import { apiTestProviders } from '../testing/api-testing';

const USERS = [
  { id: 1, email: 'ada@x.example', name: 'Ada Admin', role: 'admin', active: true },
  { id: 5, email: 'feed@x.example', name: 'GIS feed', role: 'integration', active: true },
];
const PROJECTS = [
  { id: 1, name: 'Wendlecombe bypass', description: null, createdAt: '2026-01-01T00:00:00Z' },
  { id: 2, name: 'Spur road', description: null, createdAt: '2026-01-01T00:00:00Z' },
];
const future = new Date(Date.now() + 30 * 86400_000).toISOString();
const TOKEN: ApiToken = {
  id: 3,
  userId: 5,
  name: 'Nightly feed',
  projectIds: [1, 2],
  createdAt: '2026-03-01T10:00:00Z',
  expiresAt: future,
  revokedAt: null,
  lastUsedAt: null,
};
const SECRET = 'sli_0123456789abcdefSECRET';

/** The day of an instant as the page writes it (y-MM-dd, local time). */
function localDay(iso: string): string {
  const d = new Date(iso);
  const two = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${two(d.getMonth() + 1)}-${two(d.getDate())}`;
}

describe('TokenAdmin', () => {
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [TokenAdmin],
      providers: [
        ...apiTestProviders(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((e) => e.remove());
  });

  async function render(tokens: ApiToken[] = [TOKEN]): Promise<ComponentFixture<TokenAdmin>> {
    const fixture = TestBed.createComponent(TokenAdmin);
    await fixture.whenStable();
    backend.expectOne('/api/v1/tokens').flush(tokens);
    backend.expectOne('/api/v1/users').flush(USERS);
    backend.expectOne('/api/v1/projects').flush(PROJECTS);
    await fixture.whenStable();
    return fixture;
  }

  function fillForm(fixture: ComponentFixture<TokenAdmin>): void {
    const form = (fixture.componentInstance as unknown as { form: { setValue(v: unknown): void } })
      .form;
    form.setValue({ userId: 5, name: 'Survey sync', projectIds: [2], days: 30 });
  }

  it('lists tokens with their user, projects and state by name', async () => {
    const el = (await render()).nativeElement as HTMLElement;
    const row = el.querySelector('[data-testid=token-row]')!;
    expect(row.textContent).toContain('Nightly feed');
    expect(row.textContent).toContain('GIS feed');
    expect(row.textContent).toContain('Wendlecombe bypass, Spur road');
    const created = row.querySelector('[data-label=Created]')?.textContent?.trim() ?? '';
    expect(created).toMatch(/^\d{4}-\d\d-\d\d \d\d:\d\d$/);
    expect(created.slice(0, 10)).toBe(localDay(TOKEN.createdAt));
    expect(row.textContent).toContain('never');
    expect(row.querySelector('[data-testid=token-state]')?.textContent).toContain('Active');
  });

  it('offers only active integration users to hold a token', async () => {
    const fixture = await render();
    const cmp = fixture.componentInstance as unknown as { integrationUsers(): { id: number }[] };
    expect(cmp.integrationUsers().map((u) => u.id)).toEqual([5]);
  });

  it('shows a new token once, with the warning, and forgets it after closing', async () => {
    const fixture = await render([]);
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[data-testid=token-once]')).toBeNull();
    fillForm(fixture);
    el.querySelector<HTMLFormElement>('[data-testid=create-token]')!.dispatchEvent(
      new Event('submit'),
    );
    const req = backend.expectOne('/api/v1/tokens');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ userId: 5, name: 'Survey sync', projectIds: [2], days: 30 });
    const createdAt = new Date().toISOString();
    req.flush(
      { ...TOKEN, id: 8, name: 'Survey sync', projectIds: [2], createdAt, token: SECRET },
      { status: 201, statusText: 'Created' },
    );
    await fixture.whenStable();

    const once = el.querySelector<HTMLElement>('[data-testid=token-once]');
    expect(once).not.toBeNull();
    // The form is empty again for the next token, and not marked as wrong.
    expect(el.querySelectorAll('mat-error').length).toBe(0);
    expect(once!.textContent).toContain(SECRET);
    expect(once!.textContent).toContain('it will not be shown again');
    expect(once!.querySelector('[data-testid=copy-token]')).not.toBeNull();
    // The table lists the new token, never its secret.
    expect(el.querySelector('[data-testid=token-table]')?.textContent).toContain('Survey sync');
    expect(el.querySelector('[data-testid=token-table]')?.textContent).not.toContain(SECRET);
    // … with when it was made, as the API answered.
    const made = Array.from(el.querySelectorAll('[data-testid=token-row]')).find((r) =>
      r.textContent?.includes('Survey sync'),
    );
    expect(made?.querySelector('[data-label=Created]')?.textContent).toContain(localDay(createdAt));

    once!.querySelector<HTMLButtonElement>('[data-testid=close-token]')!.click();
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=token-once]')).toBeNull();
    expect(el.textContent).not.toContain(SECRET);
  });

  it('keeps the form and shows the API’s words when a token cannot be made', async () => {
    const fixture = await render([]);
    const el = fixture.nativeElement as HTMLElement;
    fillForm(fixture);
    el.querySelector<HTMLFormElement>('[data-testid=create-token]')!.dispatchEvent(
      new Event('submit'),
    );
    backend.expectOne('/api/v1/tokens').flush(
      {
        title: 'Unprocessable',
        status: 422,
        detail: 'API tokens are for users of role integration.',
      },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=create-problem]')?.textContent).toContain(
      'API tokens are for users of role integration.',
    );
    expect(el.querySelector('[data-testid=token-once]')).toBeNull();
    const form = (fixture.componentInstance as unknown as { form: { getRawValue(): unknown } })
      .form;
    expect(form.getRawValue()).toEqual({
      userId: 5,
      name: 'Survey sync',
      projectIds: [2],
      days: 30,
    });
  });

  it('does not send a token without a user, a name or a project', async () => {
    const fixture = await render([]);
    const el = fixture.nativeElement as HTMLElement;
    el.querySelector<HTMLFormElement>('[data-testid=create-token]')!.dispatchEvent(
      new Event('submit'),
    );
    await fixture.whenStable();
    backend.expectNone('/api/v1/tokens');
    expect(el.textContent).toContain('Grant at least one project.');
    expect(el.textContent).toContain('Pick the integration user');
  });

  it('refuses a number of days out of range', async () => {
    const fixture = await render([]);
    const form = (
      fixture.componentInstance as unknown as {
        form: { controls: { days: { setValue(v: number): void; valid: boolean } } };
      }
    ).form;
    form.controls.days.setValue(0);
    expect(form.controls.days.valid).toBe(false);
    form.controls.days.setValue(2.5);
    expect(form.controls.days.valid).toBe(false);
    form.controls.days.setValue(90);
    expect(form.controls.days.valid).toBe(true);
  });

  it('revokes only after the confirmation, with DELETE', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    el.querySelector<HTMLButtonElement>('[data-testid=revoke-token]')!.click();
    await fixture.whenStable();
    backend.expectNone('/api/v1/tokens/3');
    document.querySelector<HTMLButtonElement>('[data-testid=confirm]')!.click();
    await fixture.whenStable();
    const req = backend.expectOne('/api/v1/tokens/3');
    expect(req.request.method).toBe('DELETE');
    req.flush({ ...TOKEN, revokedAt: new Date().toISOString() });
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=token-state]')?.textContent).toContain('Revoked');
    expect(el.querySelector('[data-testid=revoke-token]')).toBeNull();
  });

  it('names the state of a token', () => {
    const now = Date.parse('2026-06-01T00:00:00Z');
    expect(tokenState({ ...TOKEN, expiresAt: '2026-07-01T00:00:00Z' }, now)).toBe('active');
    expect(tokenState({ ...TOKEN, expiresAt: '2026-05-01T00:00:00Z' }, now)).toBe('expired');
    expect(tokenState({ ...TOKEN, revokedAt: '2026-05-20T00:00:00Z' }, now)).toBe('revoked');
  });
});
