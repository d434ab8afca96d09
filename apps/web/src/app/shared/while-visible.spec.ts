import { whileVisible } from './while-visible';

describe('whileVisible', () => {
  let state: DocumentVisibilityState;

  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    state = 'visible';
    Object.defineProperty(document, 'visibilityState', { configurable: true, get: () => state });
  });
  afterEach(() => {
    vi.useRealTimers();
    // the document's own visibilityState (on its prototype) again
    delete (document as { visibilityState?: unknown }).visibilityState;
  });

  function show(s: DocumentVisibilityState) {
    state = s;
    document.dispatchEvent(new Event('visibilitychange'));
  }

  it('ticks every ms while the page is in view, the first ms after subscribing', () => {
    let ticks = 0;
    const sub = whileVisible(document, 1000).subscribe(() => ticks++);
    vi.advanceTimersByTime(999);
    expect(ticks).toBe(0);
    vi.advanceTimersByTime(1);
    expect(ticks).toBe(1);
    vi.advanceTimersByTime(3000);
    expect(ticks).toBe(4);
    sub.unsubscribe();
    vi.advanceTimersByTime(5000);
    expect(ticks).toBe(4);
  });

  it('stops while the page is hidden, and ticks at once when it comes back into view', () => {
    let ticks = 0;
    const sub = whileVisible(document, 1000).subscribe(() => ticks++);
    vi.advanceTimersByTime(1500);
    expect(ticks).toBe(1);
    show('hidden');
    vi.advanceTimersByTime(10_000);
    expect(ticks).toBe(1);
    show('visible');
    vi.advanceTimersByTime(0);
    expect(ticks).toBe(2);
    vi.advanceTimersByTime(1000);
    expect(ticks).toBe(3);
    // a second 'visible' without a change in between: no extra tick
    show('visible');
    vi.advanceTimersByTime(0);
    expect(ticks).toBe(3);
    sub.unsubscribe();
  });

  it('starts silent on a page opened out of view, and ticks once it is seen', () => {
    state = 'hidden';
    let ticks = 0;
    const sub = whileVisible(document, 1000).subscribe(() => ticks++);
    vi.advanceTimersByTime(5000);
    expect(ticks).toBe(0);
    show('visible');
    vi.advanceTimersByTime(0);
    expect(ticks).toBe(1);
    sub.unsubscribe();
  });
});
