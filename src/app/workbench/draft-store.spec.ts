import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { DraftStore } from './draft-store';

const designA = '00000000-0000-4000-9000-00000000000a';
const designB = '00000000-0000-4000-9000-00000000000b';
const PREFIX = 'quietbridge.draft.';

describe('DraftStore', () => {
  let store: DraftStore;

  function ourKeys(): string[] {
    return Array.from({ length: localStorage.length }, (_, i) => localStorage.key(i)).filter((key): key is string => key?.startsWith(PREFIX) ?? false);
  }

  function clearOurs(): void {
    for (const key of ourKeys()) localStorage.removeItem(key);
  }

  beforeEach(() => {
    clearOurs();
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    store = TestBed.inject(DraftStore);
  });

  afterEach(() => {
    clearOurs();
    jasmine.clock().uninstall();
  });

  it('should have no draft for a design nothing was saved for', () => {
    expect(store.newest(designA)).toBeNull();
  });

  it('should give back a saved draft with its design, base version, time and document', () => {
    jasmine.clock().install();
    jasmine.clock().mockDate(new Date('2026-11-04T08:15:00.000Z'));
    store.save(designA, 3, { name: 'Line sensor, pressure', chain: [{ id: 'lp', kind: 'lowPass', corner: 300 }] });
    expect(store.newest(designA)).toEqual({
      designId: designA,
      baseVersion: 3,
      savedAt: '2026-11-04T08:15:00.000Z',
      document: { name: 'Line sensor, pressure', chain: [{ id: 'lp', kind: 'lowPass', corner: 300 }] },
    });
    expect(ourKeys()).toEqual([`${PREFIX}${designA}.3`]);
  });

  it('should keep one draft per base version, replacing an earlier save on the same base', () => {
    store.save(designA, 3, { name: 'first' });
    store.save(designA, 3, { name: 'second' });
    expect(ourKeys().length).toBe(1);
    expect(store.newest(designA)?.document).toEqual({ name: 'second' });
  });

  it('should restore the newest draft of a design across base versions, and only that design', () => {
    jasmine.clock().install();
    jasmine.clock().mockDate(new Date('2026-11-04T08:00:00.000Z'));
    store.save(designA, 4, { name: 'on version 4' });
    jasmine.clock().mockDate(new Date('2026-11-04T09:00:00.000Z'));
    store.save(designA, 3, { name: 'on version 3, later' });
    jasmine.clock().mockDate(new Date('2026-11-04T10:00:00.000Z'));
    store.save(designB, 1, { name: 'other design' });

    expect(store.newest(designA)).toEqual(jasmine.objectContaining({ baseVersion: 3, document: { name: 'on version 3, later' } }));
    expect(store.newest(designB)).toEqual(jasmine.objectContaining({ designId: designB, baseVersion: 1 }));
  });

  it('should not take base version 1 of one key for base version 12 of another', () => {
    store.save(designA, 12, { name: 'on version 12' });
    store.discard(designA, 1);
    expect(store.newest(designA)?.baseVersion).toBe(12);
  });

  it('should clear only the draft of the design and base version it is told', () => {
    store.save(designA, 3, { name: 'a3' });
    store.save(designA, 4, { name: 'a4' });
    store.save(designB, 3, { name: 'b3' });
    store.discard(designA, 4);
    expect(store.newest(designA)?.document).toEqual({ name: 'a3' });
    store.discard(designA, 3);
    expect(store.newest(designA)).toBeNull();
    expect(store.newest(designB)?.document).toEqual({ name: 'b3' });
  });

  it('should ignore stored data that is not a draft and still find a good one beside it', () => {
    store.save(designA, 2, { name: 'good' });
    const good = store.newest(designA)!;
    const later = '2999-01-01T00:00:00.000Z';
    const corrupt: Record<string, string> = {
      'not JSON': '{not json',
      'null': 'null',
      'a number': '42',
      'a text base version': JSON.stringify({ designId: designA, baseVersion: '3', savedAt: later, document: {} }),
      'a number for the time': JSON.stringify({ designId: designA, baseVersion: 3, savedAt: 7, document: {} }),
      'a text document': JSON.stringify({ designId: designA, baseVersion: 3, savedAt: later, document: 'text' }),
      'a null document': JSON.stringify({ designId: designA, baseVersion: 3, savedAt: later, document: null }),
      'a list for the document': JSON.stringify({ designId: designA, baseVersion: 3, savedAt: later, document: [1, 2] }),
      'no document': JSON.stringify({ designId: designA, baseVersion: 3, savedAt: later }),
      'the draft of another design': JSON.stringify({ designId: designB, baseVersion: 3, savedAt: later, document: {} }),
    };
    for (const [what, stored] of Object.entries(corrupt)) {
      localStorage.setItem(`${PREFIX}${designA}.3`, stored);
      expect(store.newest(designA)).withContext(what).toEqual(good);
    }
  });

  it('should keep the page working when the browser refuses to store the draft', () => {
    spyOn(Storage.prototype, 'setItem').and.throwError(new DOMException('The quota has been exceeded.', 'QuotaExceededError'));
    expect(() => store.save(designA, 3, { name: 'too big' })).not.toThrow();
    expect(store.newest(designA)).toBeNull();
  });
});
