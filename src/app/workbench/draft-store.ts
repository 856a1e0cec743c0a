import { Injectable } from '@angular/core';

/** An unsaved edit kept in this browser, with the version it was made on. */
export interface Draft {
  designId: string;
  baseVersion: number;
  savedAt: string;
  document: Record<string, unknown>;
}

const PREFIX = 'quietbridge.draft.';

/** Unsaved edits in localStorage, one per design and base version, so that a reload loses nothing. */
@Injectable({ providedIn: 'root' })
export class DraftStore {
  save(designId: string, baseVersion: number, document: Record<string, unknown>): void {
    const draft: Draft = { designId, baseVersion, savedAt: new Date().toISOString(), document };
    try {
      localStorage.setItem(this.key(designId, baseVersion), JSON.stringify(draft));
    } catch {
      // Storage full or refused (private mode): the edit stays in the page, only the reload safety net is missing.
    }
  }

  discard(designId: string, baseVersion: number): void {
    localStorage.removeItem(this.key(designId, baseVersion));
  }

  /** The newest draft of a design on any base version, or null. */
  newest(designId: string): Draft | null {
    let newest: Draft | null = null;
    for (let i = 0; i < localStorage.length; i++) {
      const key = localStorage.key(i);
      if (key === null || !key.startsWith(`${PREFIX}${designId}.`)) continue;
      const draft = this.read(key, designId);
      if (draft !== null && (newest === null || draft.savedAt > newest.savedAt)) newest = draft;
    }
    return newest;
  }

  /** The draft stored under a key, or null for anything else: unreadable text, a missing or non-object document, another design's draft. */
  private read(key: string, designId: string): Draft | null {
    try {
      const value = JSON.parse(localStorage.getItem(key) ?? 'null') as Partial<Draft> | null;
      if (typeof value !== 'object' || value === null) return null;
      const { document } = value;
      const isDocument = typeof document === 'object' && document !== null && !Array.isArray(document);
      return value.designId === designId && typeof value.baseVersion === 'number' && typeof value.savedAt === 'string' && isDocument ? (value as Draft) : null;
    } catch {
      return null;
    }
  }

  private key(designId: string, baseVersion: number): string {
    return `${PREFIX}${designId}.${baseVersion}`;
  }
}
