import type { ReferenceRow } from '@traceloom/shared/api';
import {
  EngineError,
  MAX_EXPRESSION_LENGTH,
  MAX_NMAX,
  parseExpression,
} from '@traceloom/shared/engine';
import { AppError } from '../http/app-error.js';
import { parseCsv } from './csv.js';
import { assertDense, mostRows } from './reference-density.js';
import { claimedKind, textContent } from './sniff.js';

/** Caps of a reference table. */
export const REFERENCE_LIMITS = { rows: 5000, columns: 3, noteLength: 1000 } as const;

/** A row that could not be read: its line and why. */
export interface RowError {
  line: number;
  message: string;
}

/** A decimal number with a point or an exponent: "0.0123", "-1.5e-7" (not "3" or "1/2"). */
const DECIMAL_NUMBER = /^[+-]?(\d+\.\d*|\.\d+|\d+(\.\d*)?[eE][+-]?\d+)$/;

/**
 * True when every row's value is a decimal number: a numeric reference, compared with a numeric
 * run within tolerance, each value known to half a unit of its last printed digit.
 */
export function isNumericTable(rows: readonly Pick<ReferenceRow, 'value'>[]): boolean {
  return rows.length > 0 && rows.every((r) => DECIMAL_NUMBER.test(r.value.trim()));
}

/** The columns a stored table keeps beside its bytes and rows, so lists read neither. */
export function referenceFacts(
  bytes: Buffer,
  rows: readonly ReferenceRow[],
): { sizeBytes: number; rowCount: number; numeric: boolean } {
  return { sizeBytes: bytes.length, rowCount: rows.length, numeric: isNumericTable(rows) };
}

/** What an uploaded file holds. */
export interface ParsedReference {
  kind: 'csv' | 'json';
  /** Every value is a decimal number (see `isNumericTable`). */
  numeric?: boolean;
  /** Title and normalization a JSON file may carry. */
  title?: string;
  normalization?: string;
  rows: ReferenceRow[];
  errors: RowError[];
}

/** Reads one row's N, value and note; returns the row or a message. */
function readRow(line: number, n: unknown, value: unknown, note: unknown): ReferenceRow | string {
  const nText = typeof n === 'number' ? String(n) : typeof n === 'string' ? n.trim() : '';
  if (!/^\d{1,4}$/.test(nText))
    return `N must be a whole number from 0 to ${MAX_NMAX}, got "${String(n).slice(0, 40)}"`;
  const N = Number(nText);
  if (N > MAX_NMAX) return `N = ${N} is beyond the largest N of ${MAX_NMAX}`;
  if (typeof value === 'number') {
    return 'value must be text: write the number in quotes ("1.25e-3") so that no printed digit is lost';
  }
  if (typeof value !== 'string' || value.trim() === '') return 'value is empty';
  if (value.length > MAX_EXPRESSION_LENGTH) {
    return `value is ${value.length} characters long; the limit is ${MAX_EXPRESSION_LENGTH}`;
  }
  try {
    parseExpression(value);
  } catch (e) {
    if (e instanceof EngineError) return `value: ${e.message}`;
    throw e;
  }
  const noteText = note === undefined || note === null ? '' : String(note);
  if (noteText.length > REFERENCE_LIMITS.noteLength) {
    return `note is longer than ${REFERENCE_LIMITS.noteLength} characters`;
  }
  return { line, N, value: value.trim(), note: noteText.trim() };
}

function collect(parsed: ParsedReference, line: number, row: ReferenceRow | string): void {
  if (typeof row === 'string') return void parsed.errors.push({ line, message: row });
  const twin = parsed.rows.find((r) => r.N === row.N);
  if (twin)
    parsed.errors.push({ line, message: `N = ${row.N} is already given on line ${twin.line}` });
  else parsed.rows.push(row);
}

function tooManyRows(count: number): never {
  throw new AppError(
    400,
    'too_many_rows',
    `The file has ${count} rows; the limit is ${REFERENCE_LIMITS.rows}.`,
    'file',
  );
}

function fromCsv(text: string): ParsedReference {
  const trimmed = text.trimStart();
  if (trimmed.startsWith('{') || trimmed.startsWith('[')) {
    throw new AppError(
      415,
      'unsupported_content',
      'The file claims to be CSV but holds JSON.',
      'file',
    );
  }
  let records;
  try {
    records = parseCsv(text);
  } catch (e) {
    const { line, message } = e as RowError;
    return { kind: 'csv', rows: [], errors: [{ line, message }] };
  }
  const parsed: ParsedReference = { kind: 'csv', rows: [], errors: [] };
  const [header, ...body] = records;
  const names = header?.fields.map((f) => f.trim().toLowerCase()) ?? [];
  if (
    names[0] !== 'n' ||
    names[1] !== 'value' ||
    (names.length > 2 && names[2] !== 'note') ||
    names.length > 3
  ) {
    parsed.errors.push({ line: header?.line ?? 1, message: 'the header must be N,value,note' });
    return parsed;
  }
  if (body.length > REFERENCE_LIMITS.rows) tooManyRows(body.length);
  for (const { line, fields } of body) {
    if (fields.length > REFERENCE_LIMITS.columns) {
      parsed.errors.push({
        line,
        message: `has ${fields.length} columns; the limit is ${REFERENCE_LIMITS.columns} (N,value,note) — quote a value that holds commas`,
      });
      continue;
    }
    collect(parsed, line, readRow(line, fields[0], fields[1], fields[2]));
  }
  if (body.length === 0) parsed.errors.push({ line: 2, message: 'the file has no rows' });
  return parsed;
}

function fromJson(text: string): ParsedReference {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    const why = e instanceof Error ? e.message : 'it does not parse';
    throw new AppError(
      415,
      'unsupported_content',
      `The file claims to be JSON but is not: ${why}.`,
      'file',
    );
  }
  const parsed: ParsedReference = { kind: 'json', rows: [], errors: [] };
  if (
    !data ||
    typeof data !== 'object' ||
    Array.isArray(data) ||
    !Array.isArray((data as { rows?: unknown }).rows)
  ) {
    parsed.errors.push({
      line: 1,
      message:
        'a JSON reference table is an object {title?, normalization?, rows: [{N, value, note?}]}',
    });
    return parsed;
  }
  const { title, normalization, rows } = data as {
    title?: unknown;
    normalization?: unknown;
    rows: unknown[];
  };
  if (typeof title === 'string') parsed.title = title;
  if (typeof normalization === 'string') parsed.normalization = normalization;
  if (rows.length > REFERENCE_LIMITS.rows) tooManyRows(rows.length);
  rows.forEach((entry, i) => {
    const line = i + 1;
    if (!entry || typeof entry !== 'object' || Array.isArray(entry)) {
      return void parsed.errors.push({
        line,
        message: 'a row must be an object {N, value, note?}',
      });
    }
    const extra = Object.keys(entry).filter((k) => !['N', 'value', 'note'].includes(k));
    if (extra.length)
      return void parsed.errors.push({ line, message: `unknown key "${extra[0]!.slice(0, 40)}"` });
    const { N, value, note } = entry as Record<string, unknown>;
    collect(parsed, line, readRow(line, N, value, note));
  });
  if (rows.length === 0) parsed.errors.push({ line: 1, message: 'the file has no rows' });
  return parsed;
}

/**
 * Reads an uploaded reference table. The kind comes from the name or declared type, the content
 * is checked to be text of that kind (415 otherwise); rows are read and checked (N, the value's
 * syntax, duplicates, column and row caps). Row problems are collected with their line (JSON:
 * the row's position) so a dry run can show them all.
 */
export function parseReferenceFile(
  bytes: Buffer,
  filename: string,
  contentType: string,
): ParsedReference {
  const kind = claimedKind(filename, contentType);
  // A sparse file is refused before megabytes of blank lines are decoded and read.
  assertDense(bytes.length, mostRows(bytes, kind));
  const text = textContent(bytes, kind);
  const parsed = kind === 'csv' ? fromCsv(text) : fromJson(text);
  parsed.numeric = isNumericTable(parsed.rows);
  return parsed;
}
