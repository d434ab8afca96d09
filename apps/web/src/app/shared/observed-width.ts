import {
  afterNextRender,
  DestroyRef,
  ElementRef,
  inject,
  signal,
  type Signal,
} from '@angular/core';

/**
 * The width of the host element in whole CSS pixels, kept up to date by a ResizeObserver that
 * starts after the first render and is disconnected when the host is destroyed. It stays null
 * until the element has been measured with a width above 0, and always where the platform has
 * no ResizeObserver (jsdom in the unit tests): the caller falls back to a width of its own.
 * Call it in an injection context (a field initialiser or the constructor of a component).
 */
export function observedWidth(): Signal<number | null> {
  const host = inject<ElementRef<Element>>(ElementRef);
  const destroyRef = inject(DestroyRef);
  const width = signal<number | null>(null);
  afterNextRender(() => {
    if (typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver((entries) => {
      const w = Math.round(entries[0]?.contentRect.width ?? 0);
      if (w > 0) width.set(w);
    });
    observer.observe(host.nativeElement);
    destroyRef.onDestroy(() => observer.disconnect());
  });
  return width.asReadonly();
}
