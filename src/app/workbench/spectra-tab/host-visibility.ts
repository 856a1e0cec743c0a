import { DestroyRef, ElementRef, inject, signal, type Signal } from '@angular/core';

/**
 * Whether the host element is on screen, so that work only the screen needs (a spectrum of a
 * million samples) waits until its tab is opened.
 */
export function observeVisibility(): Signal<boolean> {
  const host = inject(ElementRef).nativeElement as HTMLElement;
  const visible = signal(typeof IntersectionObserver === 'undefined');
  if (typeof IntersectionObserver === 'undefined') return visible;
  const observer = new IntersectionObserver((entries) => visible.set(entries.some((entry) => entry.isIntersecting)));
  observer.observe(host);
  inject(DestroyRef).onDestroy(() => observer.disconnect());
  return visible;
}
