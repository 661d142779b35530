import { AppError } from '../http/app-error.js';

/** Signatures of common binary formats (file magic numbers, common practice). */
const MAGIC: ReadonlyArray<[name: string, bytes: number[]]> = [
  ['a PNG image', [0x89, 0x50, 0x4e, 0x47]],
  ['a ZIP archive (or an office document)', [0x50, 0x4b, 0x03, 0x04]],
  ['a PDF document', [0x25, 0x50, 0x44, 0x46]],
  ['a GIF image', [0x47, 0x49, 0x46, 0x38]],
  ['a JPEG image', [0xff, 0xd8, 0xff]],
  ['a gzip archive', [0x1f, 0x8b]],
];

/** What an upload says it is. */
export type ClaimedKind = 'csv' | 'json';

function unsupported(message: string): never {
  throw new AppError(415, 'unsupported_content', message, 'file');
}

/** CSV or JSON, from the file name's extension or else its declared content type; else 415. */
export function claimedKind(filename: string, contentType: string): ClaimedKind {
  const ext = filename.toLowerCase().match(/\.([a-z0-9]+)$/)?.[1];
  if (ext === 'csv' || ext === 'txt') return 'csv';
  if (ext === 'json') return 'json';
  const type = contentType.toLowerCase().split(';')[0]!.trim();
  if (type === 'text/csv' || type === 'text/plain') return 'csv';
  if (type === 'application/json') return 'json';
  return unsupported(`Upload a CSV (.csv) or JSON (.json) file; "${filename}" is neither.`);
}

/**
 * Checks that the bytes are text as claimed: no known binary signature, no NUL byte, valid
 * UTF-8. Returns the text without a byte-order mark; 415 `unsupported_content` otherwise.
 */
export function textContent(bytes: Buffer, kind: ClaimedKind): string {
  for (const [name, magic] of MAGIC) {
    if (magic.every((b, i) => bytes[i] === b)) {
      unsupported(`The file claims to be ${kind.toUpperCase()} but its content is ${name}.`);
    }
  }
  if (bytes.includes(0)) unsupported(`The file claims to be ${kind.toUpperCase()} but is binary.`);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return unsupported(`The file claims to be ${kind.toUpperCase()} but is not UTF-8 text.`);
  }
  return text.startsWith('\uFEFF') ? text.slice(1) : text;
}
