import { DestroyRef, ElementRef, inject, signal, type Signal } from '@angular/core';

/**
 * The width the host element is given, kept up to date by a ResizeObserver, so that a chart draws
 * at its real size instead of scaling its text.
 */
export function observeWidth(fallback = 640): Signal<number> {
  const host = inject(ElementRef).nativeElement as HTMLElement;
  const width = signal(fallback);
  if (typeof ResizeObserver === 'undefined') return width;
  const observer = new ResizeObserver((entries) => {
    const measured = Math.floor(entries[0].contentRect.width);
    if (measured > 0) width.set(measured);
  });
  observer.observe(host);
  inject(DestroyRef).onDestroy(() => observer.disconnect());
  return width;
}
