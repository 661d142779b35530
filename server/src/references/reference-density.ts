import { AppError } from '../http/app-error.js';

/**
 * How much a file may exceed what its rows explain: `baseBytes` for headers, a title or a short
 * file, and `bytesPerRow` for each row read (the longest row holds a 4 KB value and a
 * 1,000-character note). One row and megabytes of blank lines or padding is refused.
 */
export const REFERENCE_DENSITY = { baseBytes: 64 * 1024, bytesPerRow: 16 * 1024 } as const;

const MB = 1024 * 1024;

/** `3.3 KB`, `64 KB`, `10.0 MB`. */
export function sizeText(bytes: number): string {
  if (bytes >= MB) return `${(bytes / MB).toFixed(1)} MB`;
  const kb = bytes / 1024;
  return `${Number.isInteger(kb) ? kb : kb.toFixed(1)} KB`;
}

/**
 * Refuses a file far larger than its content: more than `baseBytes + bytesPerRow x rows` gives
 * 413 `file_too_sparse` naming `file` and the limit. `rows` counts every row read, good or not
 * (or, before reading, an upper bound of them: the verdict is then the same).
 */
export function assertDense(bytes: number, rows: number): void {
  const { baseBytes, bytesPerRow } = REFERENCE_DENSITY;
  const allowed = baseBytes + bytesPerRow * rows;
  if (bytes <= allowed) return;
  throw new AppError(
    413,
    'file_too_sparse',
    `file: ${sizeText(bytes)} for ${rows === 1 ? '1 row' : `${rows} rows`} is more than a table may take: ${sizeText(baseBytes)} plus ${sizeText(bytesPerRow)} per row (blank lines and padding count), ${sizeText(allowed)} here. Remove the blank lines and upload again; nothing was stored.`,
    'file',
  );
}

/**
 * Most rows a file can hold, counted without reading it (a byte scan): CSV, the lines with
 * anything but white space after the header (a row starts on one); JSON, the opening braces
 * (a row is an object).
 * Lets a worker refuse a sparse file before parsing megabytes of nothing.
 */
export function mostRows(bytes: Uint8Array, kind: 'csv' | 'json'): number {
  let count = 0;
  if (kind === 'json') {
    for (let i = 0; i < bytes.length; i++) if (bytes[i] === 0x7b) count += 1;
    return count;
  }
  let content = false;
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i]!;
    if (b === 0x0a || b === 0x0d) {
      if (content) count += 1;
      content = false;
    } else if (b > 0x20) content = true;
  }
  return Math.max(0, (content ? count + 1 : count) - 1);
}
