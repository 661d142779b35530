import { DATASET_FORMAT } from '@traceloom/shared/api';
import { createHash } from 'node:crypto';
import type { DatasetDocument, DatasetPersonDto, DatasetSnapshot } from '@traceloom/shared/api';
import { csvRow, knownSentence, renderCsv, renderLatex } from '@traceloom/shared/format';
import type { Dataset } from '../db/entities/index.js';
import { datasetChecks } from './dataset-checks.js';
import { person, type DatasetChildren } from './dataset-dto.js';
import { canonicalText } from './canonical-json.js';
import { datasetAuthors } from './dataset-authors.js';
import { readSnapshot } from './snapshot.js';

/** Builds the document of `d` as it is locked by `lockedBy` at `lockedAt`. */
export function buildDocument(
  d: Dataset,
  children: DatasetChildren,
  lockedBy: DatasetPersonDto,
  lockedAt: string,
): DatasetDocument {
  const snapshot = readSnapshot(d.snapshot);
  return {
    format: DATASET_FORMAT,
    id: d.id,
    title: d.title,
    description: d.description,
    version: d.version,
    supersedes: d.supersedes ? { id: d.supersedes.id, version: d.supersedes.version } : null,
    study: { id: d.study.id, title: d.study.title },
    createdBy: person(d.createdBy),
    createdAt: d.createdAt,
    authors: datasetAuthors(d, children).authors,
    lockedBy,
    lockedAt,
    snapshot,
    checks: datasetChecks(snapshot, children.waivers),
    reviews: children.reviews.map((r) => ({
      reviewer: person(r.reviewer),
      verdict: r.verdict,
      comment: r.comment,
      at: r.createdAt,
    })),
    comments: children.comments.map((c) => ({
      author: person(c.author),
      N: c.rowN,
      body: c.body,
      at: c.createdAt,
    })),
  };
}

/**
 * The canonical JSON of any JSON value (RFC 8785, JSON Canonicalization Scheme, through the
 * `canonicalize` package) and its SHA-256 in lower-case hex (FIPS 180-4).
 */
export function canonicalHash(value: unknown): { canonical: string; hash: string } {
  const canonical = canonicalText(value);
  return { canonical, hash: sha256Hex(canonical) };
}

/** SHA-256 of a text's UTF-8 bytes, lower-case hex. */
export function sha256Hex(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** What the CSV and LaTeX exports name besides the tables. */
export interface ExportHeading {
  title: string;
  version: number;
  lockedAt: string | null;
  hash: string | null;
}

/**
 * CSV of a dataset: metadata rows (title, version, locked, hash, what is known of the values:
 * exact, truncated or numeric with its error estimate), a blank line, then the
 * canonical and class tables. Every cell goes through `csvCell`: text starting with = + - @ TAB
 * CR gets a leading ' (OWASP CSV Injection cheat sheet), numbers stay numbers.
 */
export function datasetCsv(h: ExportHeading, result: DatasetSnapshot['result']): string {
  const meta = [
    ['dataset', h.title],
    ['version', String(h.version)],
    ['locked', h.lockedAt ?? 'not locked'],
    ['sha256', h.hash ?? 'not locked'],
    ['values', knownSentence(result)],
  ];
  const head = meta.map(csvRow).join('\n');
  return `${head}\n\n${renderCsv(result)}`;
}

/** The LaTeX export of a dataset: the run layout, after comment lines naming it and its hash. */
export function datasetLatex(h: ExportHeading, result: DatasetSnapshot['result']): string {
  return renderLatex(result, [
    `${h.title}, version ${h.version}, ${h.lockedAt ? `locked ${h.lockedAt}` : 'not locked'}`,
    `SHA-256 ${h.hash ?? '(not locked)'}`,
    `values: ${knownSentence(result)}`,
  ]);
}
