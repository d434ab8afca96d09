import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { AdminNotice, type Notice, refused } from './admin-notice';

@Component({
  selector: 'sl-host',
  imports: [AdminNotice],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<p slAdminNotice [notice]="notice()" data-testid="notice"></p>`,
})
class Host {
  readonly notice = signal<Notice | null>(null);
}

describe('AdminNotice', () => {
  async function render() {
    const fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    const p = (fixture.nativeElement as HTMLElement).querySelector('[data-testid=notice]')!;
    return { fixture, p };
  }

  it('is an empty live region until there is something to say', async () => {
    const { p } = await render();
    expect(p.getAttribute('aria-live')).toBe('polite');
    expect(p.textContent?.trim()).toBe('');
    expect(p.classList.contains('outcome')).toBe(false);
  });

  it('says a change was made with a tick and the words', async () => {
    const { fixture, p } = await render();
    fixture.componentInstance.notice.set({ ok: true, text: 'Nia Checker is now viewer.' });
    await fixture.whenStable();
    expect([...p.classList]).toEqual(expect.arrayContaining(['outcome', 'ok']));
    expect(p.classList.contains('bad')).toBe(false);
    expect(p.querySelector('mat-icon')?.textContent).toBe('check_circle');
    expect(p.textContent).toContain('Nia Checker is now viewer.');
  });

  it('says what was refused and the reason the API gave, then clears', async () => {
    const { fixture, p } = await render();
    const err = new HttpErrorResponse({
      status: 409,
      statusText: 'Conflict',
      error: { title: 'Conflict', status: 409, detail: 'Not today.' },
    });
    fixture.componentInstance.notice.set(refused('Evan Engineer was not changed', err));
    await fixture.whenStable();
    expect([...p.classList]).toEqual(expect.arrayContaining(['outcome', 'bad']));
    expect(p.querySelector('mat-icon')?.textContent).toBe('error');
    expect(p.textContent).toContain('Evan Engineer was not changed: Not today.');

    fixture.componentInstance.notice.set(null);
    await fixture.whenStable();
    expect(p.textContent?.trim()).toBe('');
    expect(p.classList.contains('outcome')).toBe(false);
  });

  it('falls back to the title when the problem has no detail', () => {
    const err = new HttpErrorResponse({
      status: 403,
      statusText: 'Forbidden',
      error: { title: 'Forbidden', status: 403 },
    });
    expect(refused('“feed” was not revoked', err)).toEqual({
      ok: false,
      text: '“feed” was not revoked: Forbidden',
    });
  });
});
