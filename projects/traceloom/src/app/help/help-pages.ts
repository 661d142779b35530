/** A page of the user guide (a Markdown file under docs/, served at /docs). */
export interface HelpPage {
  slug: string;
  title: string;
}

/**
 * The guide's pages in reading order. Pages whose file does not exist (yet) are left out of the
 * list at run time, so the menu shows exactly the docs/*.md that were shipped.
 */
export const HELP_PAGES: readonly HelpPage[] = [
  { slug: 'getting-started', title: 'Getting started' },
  { slug: 'spec', title: 'The gas spec' },
  { slug: 'gas-spec', title: 'The gas spec' },
  { slug: 'expressions', title: 'Expressions' },
  { slug: 'methods', title: 'Methods and cautions' },
  { slug: 'numeric', title: 'Numeric mode' },
  { slug: 'large-n', title: 'Large N' },
  { slug: 'sectors', title: 'Sector sums' },
  { slug: 'conventions', title: 'Conventions' },
  { slug: 'checks', title: 'Checks and reference tables' },
  { slug: 'datasets', title: 'Datasets' },
  { slug: 'api', title: 'HTTP API' },
  { slug: 'operations', title: 'Operations and security' },
  { slug: 'deployment', title: 'Server and workers' },
  { slug: 'cli', title: 'Command line' },
];

/** True when a response body is the app's own page (the server's fallback), not Markdown. */
export function isHtmlFallback(text: string): boolean {
  return /^\s*<!doctype html/i.test(text) || /^\s*<html[\s>]/i.test(text);
}

/** A heading of the rendered page, for the table of contents. */
export interface TocEntry {
  id: string;
  text: string;
  level: number;
}

/** An id for a heading's text (`Signing in` -> `signing-in`), unique within `taken`. */
export function headingId(text: string, taken: Set<string>): string {
  const base =
    text
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'section';
  let id = base;
  for (let i = 2; taken.has(id); i++) id = `${base}-${i}`;
  taken.add(id);
  return id;
}

/** Gives every h2/h3 in `root` an id and returns the table of contents. */
export function buildToc(root: HTMLElement): TocEntry[] {
  const taken = new Set<string>();
  return [...root.querySelectorAll<HTMLElement>('h2, h3')].map((h) => {
    const id = h.id || headingId(h.textContent ?? '', taken);
    h.id = id;
    return { id, text: h.textContent?.trim() ?? '', level: Number(h.tagName.slice(1)) };
  });
}
