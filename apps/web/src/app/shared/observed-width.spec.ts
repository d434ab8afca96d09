import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { observedWidth } from './observed-width';

@Component({
  selector: 'sl-measured',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `{{ width() ?? 'unmeasured' }}`,
})
class Measured {
  readonly width = observedWidth();
}

/** A stand-in for the browser's ResizeObserver: records what it observes, resizes on demand. */
class FakeObserver {
  static made: FakeObserver[] = [];
  readonly observed: Element[] = [];
  disconnected = false;

  constructor(private readonly callback: ResizeObserverCallback) {
    FakeObserver.made.push(this);
  }

  observe(el: Element): void {
    this.observed.push(el);
  }

  unobserve(): void {
    // Not used by observedWidth.
  }

  disconnect(): void {
    this.disconnected = true;
  }

  resize(width: number): void {
    const entry = { contentRect: { width } } as ResizeObserverEntry;
    this.callback([entry], this);
  }
}

describe('observedWidth', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    FakeObserver.made = [];
  });

  it('stays null, without an error, where there is no ResizeObserver', async () => {
    vi.stubGlobal('ResizeObserver', undefined);
    const fixture = TestBed.createComponent(Measured);
    await fixture.whenStable();
    expect(fixture.componentInstance.width()).toBeNull();
    expect(fixture.nativeElement.textContent).toBe('unmeasured');
    fixture.destroy();
  });

  it('follows the width of the host element after the first render, in whole pixels', async () => {
    vi.stubGlobal('ResizeObserver', FakeObserver);
    const fixture = TestBed.createComponent(Measured);
    expect(FakeObserver.made).toHaveLength(0);
    await fixture.whenStable();
    expect(FakeObserver.made).toHaveLength(1);
    const observer = FakeObserver.made[0];
    expect(observer.observed).toEqual([fixture.nativeElement]);
    expect(fixture.componentInstance.width()).toBeNull();

    observer.resize(412.6);
    expect(fixture.componentInstance.width()).toBe(413);
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toBe('413');

    observer.resize(1366);
    expect(fixture.componentInstance.width()).toBe(1366);
  });

  it('keeps the last width when the element is hidden (width 0)', async () => {
    vi.stubGlobal('ResizeObserver', FakeObserver);
    const fixture = TestBed.createComponent(Measured);
    await fixture.whenStable();
    FakeObserver.made[0].resize(640);
    FakeObserver.made[0].resize(0);
    expect(fixture.componentInstance.width()).toBe(640);
  });

  it('disconnects when the host is destroyed', async () => {
    vi.stubGlobal('ResizeObserver', FakeObserver);
    const fixture = TestBed.createComponent(Measured);
    await fixture.whenStable();
    const observer = FakeObserver.made[0];
    expect(observer.disconnected).toBe(false);
    fixture.destroy();
    expect(observer.disconnected).toBe(true);
  });
});
