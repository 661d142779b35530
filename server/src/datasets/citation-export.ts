import type { DatasetDocument } from '@traceloom/shared/api';
import type { Response } from 'express';
import type { AppContext } from '../app-context.js';
import { AppError } from '../http/app-error.js';
import { citationAuthors } from './dataset-authors.js';
import { lockedByHash } from './export-service.js';

/** BibTeX's special characters escaped (common practice: braces around a backslash command). */
function bibText(text: string): string {
  return text.replace(/[\\{}%&$#_^~]/g, (c) =>
    c === '\\' ? '{\\textbackslash}' : c === '^' ? '{\\^{}}' : c === '~' ? '{\\~{}}' : `\\${c}`,
  );
}

/** A `@misc` BibTeX entry of a locked dataset (plain BibTeX fields; the url field for biblatex). */
export function bibtexOf(doc: DatasetDocument, hash: string, address: string): string {
  const [year, month] = doc.lockedAt.slice(0, 7).split('-');
  const fields: Array<[string, string]> = [
    [
      'author',
      citationAuthors(doc)
        .map((a) => `{${bibText(a)}}`)
        .join(' and '),
    ],
    ['title', `{${bibText(doc.title)}}`],
    ['year', year!],
    ['month', String(Number(month))],
    ['version', String(doc.version)],
    ['howpublished', `Traceloom dataset, SHA-256 ${hash}`],
    ['url', address],
  ];
  const body = fields.map(([k, v]) => `  ${k} = {${v}}`).join(',\n');
  return `@misc{traceloom-${hash.slice(0, 12)},\n${body}\n}\n`;
}

/** A CSL-JSON item (CSL 1.0.2 item type "dataset") of a locked dataset. */
export function cslOf(doc: DatasetDocument, hash: string, address: string) {
  const [y, m, d] = doc.lockedAt.slice(0, 10).split('-').map(Number);
  return [
    {
      id: `traceloom-${hash.slice(0, 12)}`,
      type: 'dataset',
      title: doc.title,
      author: citationAuthors(doc).map((literal) => ({ literal })),
      issued: { 'date-parts': [[y, m, d]] },
      version: String(doc.version),
      publisher: 'Traceloom',
      URL: address,
      note: `SHA-256 ${hash}`,
    },
  ];
}

/** `GET /public/datasets/:hash/citation?format=bibtex|csl` (no sign-in): the citation as a file. */
export async function publicCitation(
  ctx: AppContext,
  hash: string | undefined,
  format: unknown,
  res: Response,
): Promise<void> {
  if (format !== 'bibtex' && format !== 'csl') {
    throw new AppError(400, 'invalid_input', 'format: must be bibtex or csl.', 'format');
  }
  const d = await lockedByHash(ctx, hash);
  const doc = JSON.parse(d.canonical!) as DatasetDocument;
  const address = `${ctx.services.mail.baseUrl}/public/${d.hash}`;
  const stem = `traceloom-${d.hash!.slice(0, 12)}`;
  if (format === 'bibtex') {
    res
      .attachment(`${stem}.bib`)
      .type('application/x-bibtex')
      .send(bibtexOf(doc, d.hash!, address));
  } else {
    res
      .attachment(`${stem}.json`)
      .type('application/vnd.citationstyles.csl+json')
      .send(JSON.stringify(cslOf(doc, d.hash!, address), null, 2));
  }
}
