import {
  ChangeDetectionStrategy,
  Component,
  provideZonelessChangeDetection,
  signal,
} from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import axe from 'axe-core';
import { FileChoice } from './file-choice';

@Component({
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FileChoice],
  template: `<sl-file-choice
    label="Terrain raster (.tif)"
    accept=".tif,.tiff"
    testId="dem"
    [(file)]="file"
  />`,
})
class Host {
  readonly file = signal<File | null>(null);
}

describe('FileChoice', () => {
  let fixture: ComponentFixture<Host>;
  let el: HTMLElement;
  const dem = new File([new Uint8Array(2500)], 'wendlecombe-dem.tif', { type: 'image/tiff' });

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
    fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    el = fixture.nativeElement as HTMLElement;
  });
  afterEach(() => {
    fixture.destroy();
    TestBed.resetTestingModule();
  });

  const picker = () => el.querySelector('[data-testid=dem]') as HTMLInputElement;
  const browse = () => el.querySelector('button.browse') as HTMLButtonElement;
  const named = (id: string | null) =>
    (id ?? '')
      .split(' ')
      .map((i) => el.querySelector(`[id="${i}"]`)?.textContent?.trim())
      .join(' ');

  async function choose(file: File): Promise<void> {
    Object.defineProperty(picker(), 'files', { value: [file], configurable: true });
    picker().dispatchEvent(new Event('change'));
    await fixture.whenStable();
  }

  it('is a labelled group: its button names the file it chooses, the input its kinds', () => {
    const group = el.querySelector('[role=group]') as HTMLElement;
    expect(named(group.getAttribute('aria-labelledby'))).toBe('Terrain raster (.tif)');
    expect(named(browse().getAttribute('aria-labelledby'))).toBe('Choose… Terrain raster (.tif)');
    expect(named(browse().getAttribute('aria-describedby'))).toBe('No file chosen');
    expect(picker().type).toBe('file');
    expect(picker().accept).toBe('.tif,.tiff');
    expect(picker().getAttribute('aria-label')).toBe('Terrain raster (.tif)');
    // out of the tab order and out of sight: the button is what the keyboard reaches
    expect(picker().tabIndex).toBe(-1);
    expect(picker().classList).toContain('sl-visually-hidden');
    expect(browse().tabIndex).toBe(0);
  });

  it('opens the browser’s picker from the button (a click, or Enter and Space on it)', () => {
    const opened = vi.spyOn(picker(), 'click').mockImplementation(() => undefined);
    browse().click();
    expect(opened).toHaveBeenCalledTimes(1);
  });

  it('shows the file chosen with its size, gives it to the binding, and removes it', async () => {
    await choose(dem);
    expect(fixture.componentInstance.file()).toBe(dem);
    expect(el.querySelector('.name')?.textContent?.trim()).toBe('wendlecombe-dem.tif');
    expect(el.querySelector('.meta')?.textContent?.trim()).toBe('2.5 kB');
    expect(el.querySelector('.none')).toBeNull();
    expect(named(browse().getAttribute('aria-labelledby'))).toBe('Change… Terrain raster (.tif)');
    expect(named(browse().getAttribute('aria-describedby'))).toBe('wendlecombe-dem.tif 2.5 kB');
    // the input is emptied, so that the same file chosen again is seen
    expect(picker().value).toBe('');

    const remove = el.querySelector('button[aria-label="Remove wendlecombe-dem.tif"]');
    (remove as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(fixture.componentInstance.file()).toBeNull();
    expect(el.querySelector('.none')?.textContent?.trim()).toBe('No file chosen');
    expect(el.querySelector('button[aria-label^=Remove]')).toBeNull();
  });

  it('shows a file the binding gives it, and keeps it when the picker is closed without one', async () => {
    fixture.componentInstance.file.set(dem);
    await fixture.whenStable();
    expect(el.querySelector('.name')?.textContent?.trim()).toBe('wendlecombe-dem.tif');
    Object.defineProperty(picker(), 'files', { value: [], configurable: true });
    picker().dispatchEvent(new Event('change'));
    await fixture.whenStable();
    expect(fixture.componentInstance.file()).toBe(dem);
  });

  it('passes axe’s rules on names, labels and roles, before and after a file is chosen', async () => {
    document.body.appendChild(el);
    try {
      const rules = {
        runOnly: { type: 'tag' as const, values: ['wcag2a', 'wcag2aa'] },
        rules: { 'color-contrast': { enabled: false } },
      };
      let results = await axe.run(el, rules);
      expect(results.violations.map((v) => v.id)).toEqual([]);
      await choose(dem);
      results = await axe.run(el, rules);
      expect(results.violations.map((v) => v.id)).toEqual([]);
      expect(results.passes.map((r) => r.id)).toEqual(
        expect.arrayContaining(['button-name', 'label']),
      );
    } finally {
      el.remove();
    }
  }, 60_000);
});
