import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { AdminUser } from './admin-api';
import { inviteOutcome, lockReason, UserAdmin } from './user-admin';
import { apiTestProviders } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';

const USERS: AdminUser[] = [
  { id: 1, email: 'ada@x.example', name: 'Ada Admin', role: 'admin', active: true },
  { id: 2, email: 'evan@x.example', name: 'Evan Engineer', role: 'engineer', active: true },
  { id: 5, email: 'feed@x.example', name: 'GIS feed', role: 'integration', active: true },
];

describe('UserAdmin', () => {
  let backend: HttpTestingController;

  beforeEach(() => {
    signInAs('admin', { id: 1, email: 'ada@x.example', name: 'Ada Admin' });
    TestBed.configureTestingModule({
      imports: [UserAdmin],
      providers: [
        ...apiTestProviders(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    sessionStorage.clear();
    document.querySelectorAll('.cdk-overlay-container').forEach((e) => e.remove());
  });

  async function render(users = USERS): Promise<ComponentFixture<UserAdmin>> {
    const fixture = TestBed.createComponent(UserAdmin);
    await fixture.whenStable();
    backend.expectOne('/api/v1/users').flush(users);
    await fixture.whenStable();
    return fixture;
  }

  function rowOf(el: HTMLElement, name: string): HTMLElement {
    const row = [...el.querySelectorAll<HTMLElement>('[data-testid=user-row]')].find((r) =>
      r.textContent?.includes(name),
    );
    if (!row) throw new Error(`no row for ${name}`);
    return row;
  }

  function toggleOf(row: HTMLElement): HTMLButtonElement {
    return row.querySelector<HTMLButtonElement>('[data-testid=toggle-active]')!;
  }

  it('lists every user with e-mail, role and whether they may sign in', async () => {
    const el = (await render()).nativeElement as HTMLElement;
    expect(el.querySelectorAll('[data-testid=user-row]').length).toBe(3);
    const evan = rowOf(el, 'Evan Engineer');
    expect(evan.textContent).toContain('evan@x.example');
    expect(evan.textContent).toContain('engineer');
    expect(evan.querySelector('[data-testid=user-active]')?.textContent).toContain('Active');
  });

  it('does not let the admin disable or demote themselves, and says why', async () => {
    const el = (await render()).nativeElement as HTMLElement;
    const me = rowOf(el, 'Ada Admin');
    expect(toggleOf(me).disabled).toBe(true);
    expect(me.querySelector('mat-select')?.getAttribute('aria-disabled')).toBe('true');
    expect(me.textContent).toContain('you cannot disable or demote yourself');
    const other = rowOf(el, 'Evan Engineer');
    expect(toggleOf(other).disabled).toBe(false);
    expect(other.querySelector('mat-select')?.getAttribute('aria-disabled')).toBe('false');
    expect(other.textContent).not.toContain('you cannot');
  });

  it('the reason follows the signed-in user, not the role', () => {
    expect(lockReason(USERS[0], 1)).toContain('yourself');
    expect(lockReason(USERS[0], 2)).toBeNull();
    expect(lockReason(USERS[1], 2)).toContain('yourself');
  });

  it('disables a user only after the confirmation, with PATCH {active: false}', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    toggleOf(rowOf(el, 'Evan Engineer')).click();
    await fixture.whenStable();
    backend.expectNone('/api/v1/users/2');
    const confirm = document.querySelector<HTMLButtonElement>('[data-testid=confirm]');
    expect(confirm?.textContent).toContain('Disable');
    expect(document.querySelector('mat-dialog-container')?.textContent).toContain('Evan Engineer');
    confirm!.click();
    await fixture.whenStable();
    const req = backend.expectOne('/api/v1/users/2');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ active: false });
    req.flush({ ...USERS[1], active: false });
    await fixture.whenStable();
    const row = rowOf(el, 'Evan Engineer');
    expect(row.querySelector('[data-testid=user-active]')?.textContent).toContain('Disabled');
    expect(toggleOf(row).textContent).toContain('Enable');
  });

  it('sends nothing when the confirmation is cancelled', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    toggleOf(rowOf(el, 'Evan Engineer')).click();
    await fixture.whenStable();
    const cancel = [
      ...document.querySelectorAll<HTMLButtonElement>('mat-dialog-actions button'),
    ].find((b) => b.textContent?.includes('Cancel'));
    cancel!.click();
    await fixture.whenStable();
    backend.expectNone('/api/v1/users/2');
    expect(rowOf(el, 'Evan Engineer').textContent).toContain('Active');
  });

  it('changes a role with PATCH {role}, and puts it back when the API refuses', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    const cmp = fixture.componentInstance as unknown as {
      changeRole(u: AdminUser, r: string): void;
    };
    cmp.changeRole(USERS[1], 'reviewer');
    const req = backend.expectOne('/api/v1/users/2');
    expect(req.request.body).toEqual({ role: 'reviewer' });
    req.flush(
      { title: 'Conflict', status: 409, detail: 'Not today.' },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=user-notice]')?.textContent).toContain('Not today.');
    const select = rowOf(el, 'Evan Engineer').querySelector('mat-select');
    expect(select?.textContent).toContain('engineer');
    expect(select?.textContent).not.toContain('reviewer');
  });

  it('invites without a password and says where the invitation went', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    const inputs = el.querySelectorAll<HTMLInputElement>('[data-testid=invite-form] input');
    inputs[0].value = 'Nia Checker';
    inputs[0].dispatchEvent(new Event('input'));
    inputs[1].value = 'nia@x.example';
    inputs[1].dispatchEvent(new Event('input'));
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    const req = backend.expectOne('/api/v1/users');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({
      name: 'Nia Checker',
      email: 'nia@x.example',
      role: 'engineer',
    });
    req.flush(
      {
        id: 9,
        email: 'nia@x.example',
        name: 'Nia Checker',
        role: 'engineer',
        active: true,
        invited: true,
      },
      { status: 201, statusText: 'Created' },
    );
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=invite-outcome]')?.textContent).toContain(
      'Invitation sent to nia@x.example',
    );
    expect(el.querySelectorAll('[data-testid=user-row]').length).toBe(4);
    expect(inputs[0].value).toBe('');
    expect(el.querySelectorAll('mat-error').length).toBe(0);
  });

  it('shows the API’s error and keeps what was typed', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    const inputs = el.querySelectorAll<HTMLInputElement>('[data-testid=invite-form] input');
    inputs[0].value = 'Evan Again';
    inputs[0].dispatchEvent(new Event('input'));
    inputs[1].value = 'evan@x.example';
    inputs[1].dispatchEvent(new Event('input'));
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    backend
      .expectOne('/api/v1/users')
      .flush(
        { title: 'Conflict', status: 409, detail: 'evan@x.example exists already.' },
        { status: 409, statusText: 'Conflict' },
      );
    await fixture.whenStable();
    const out = el.querySelector('[data-testid=invite-outcome]');
    expect(out?.getAttribute('role')).toBe('alert');
    expect(out?.textContent).toContain('evan@x.example exists already.');
    expect(inputs[0].value).toBe('Evan Again');
    expect(inputs[1].value).toBe('evan@x.example');
    expect(el.querySelectorAll('[data-testid=user-row]').length).toBe(3);
  });

  it('does not send a form with a missing name or a wrong address', async () => {
    const fixture = await render();
    const el = fixture.nativeElement as HTMLElement;
    const inputs = el.querySelectorAll<HTMLInputElement>('[data-testid=invite-form] input');
    inputs[1].value = 'not-an-address';
    inputs[1].dispatchEvent(new Event('input'));
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
    backend.expectNone('/api/v1/users');
    expect(el.textContent).toContain("Enter the user's name.");
    expect(el.textContent).toContain('This is not an e-mail address.');
  });

  it('tells the three kinds of answer to an invitation apart', () => {
    const base = { id: 9, email: 'n@x.example', name: 'N', active: true };
    expect(inviteOutcome({ ...base, role: 'viewer', invited: true })).toEqual({
      kind: 'sent',
      email: 'n@x.example',
    });
    expect(
      inviteOutcome({ ...base, role: 'viewer', invited: false, password: 'pw-123456' }),
    ).toEqual({ kind: 'password', name: 'N', email: 'n@x.example', password: 'pw-123456' });
    expect(inviteOutcome({ ...base, role: 'integration' })).toEqual({
      kind: 'integration',
      name: 'N',
    });
  });

  it('shows the problem and a retry when the list cannot be loaded', async () => {
    const fixture = TestBed.createComponent(UserAdmin);
    await fixture.whenStable();
    backend
      .expectOne('/api/v1/users')
      .flush(
        { title: 'Forbidden', status: 403, detail: 'Admins only.' },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[role=alert]')?.textContent).toContain('Admins only.');
    [...el.querySelectorAll('button')].find((b) => b.textContent?.includes('Try again'))!.click();
    backend.expectOne('/api/v1/users').flush(USERS);
    await fixture.whenStable();
    expect(el.querySelectorAll('[data-testid=user-row]').length).toBe(3);
  });
});
