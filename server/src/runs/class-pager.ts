import { gzipSync } from 'node:zlib';

/** Class rows per stored page: a page of N = 30 rows is a few hundred kB of JSON at most. */
export const CLASS_PAGE_ROWS = 500;

/** One page of class rows as the worker hands it over: gzip of a JSON array text. */
export interface ClassPageData {
  n: number;
  page: number;
  rowCount: number;
  gzip: Uint8Array;
}

/**
 * Collects class-row JSON texts as the engine emits them (in N order) and hands over a gzipped
 * page whenever `CLASS_PAGE_ROWS` rows of one N are together or N changes, so at most one page
 * is held at a time. Counts the rows per N on the way.
 */
export class ClassPager {
  readonly counts: Record<string, number> = {};
  /** Pages handed over so far. */
  pages = 0;
  private n = -1;
  private page = 0;
  private texts: string[] = [];

  constructor(private readonly emit: (page: ClassPageData) => void) {}

  /** Adds one row (`text` is its JSON, `n` its N). */
  add(n: number, text: string): void {
    if (n !== this.n) {
      this.flush();
      this.n = n;
      this.page = 0;
    }
    this.texts.push(text);
    this.counts[n] = (this.counts[n] ?? 0) + 1;
    if (this.texts.length >= CLASS_PAGE_ROWS) this.flush();
  }

  /** Hands over the rows still held. */
  flush(): void {
    if (this.texts.length === 0) return;
    const gzip = gzipSync(`[${this.texts.join(',')}]`);
    this.emit({ n: this.n, page: this.page, rowCount: this.texts.length, gzip });
    this.page += 1;
    this.pages += 1;
    this.texts = [];
  }
}
