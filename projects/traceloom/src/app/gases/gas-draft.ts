import type { GasSpecInput } from '@traceloom/shared/engine';

/** An unsaved gas form kept in the browser, so a reload or a closed tab loses nothing. */
export interface GasDraft {
  spec: GasSpecInput;
  /** When it was last written (ISO time). */
  savedAt: string;
  /** The gas version the edits started from; null for a new gas. */
  baseVersion: number | null;
}

const PREFIX = 'traceloom.gas-draft.';

/** The storage key of a gas's draft (`gas:<id>`) or a new gas's in a study (`new:<studyId>`). */
export function draftKey(gasId: string | undefined, studyId: string | undefined): string | null {
  if (gasId) return `${PREFIX}gas:${gasId}`;
  return studyId ? `${PREFIX}new:${studyId}` : null;
}

/** The stored draft, or null when there is none or it cannot be read. */
export function readDraft(key: string | null, storage: Storage = localStorage): GasDraft | null {
  if (!key) return null;
  try {
    const draft = JSON.parse(storage.getItem(key) ?? 'null') as GasDraft | null;
    return draft && typeof draft.spec === 'object' && draft.spec !== null ? draft : null;
  } catch {
    return null;
  }
}

/** Keeps the draft (a full storage is ignored: the form itself still holds the input). */
export function writeDraft(key: string | null, draft: GasDraft, storage: Storage = localStorage) {
  if (!key) return;
  try {
    storage.setItem(key, JSON.stringify(draft));
  } catch {
    // Storage full or off: nothing else to do, the form keeps what was typed.
  }
}

/** Forgets the draft (after saving, or when the user discards it). */
export function clearDraft(key: string | null, storage: Storage = localStorage): void {
  if (key) storage.removeItem(key);
}
