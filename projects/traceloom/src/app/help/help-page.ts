import { HttpClient } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { MarkdownComponent, provideMarkdown } from 'ngx-markdown';
import { catchError, forkJoin, map, of } from 'rxjs';
import { ensureKatexStyles } from '../shared/katex-setup';
import { HELP_PAGES, HelpPage, TocEntry, buildToc, isHtmlFallback } from './help-pages';

const KATEX_OPTIONS = {
  throwOnError: false,
  delimiters: [
    { left: '$$', right: '$$', display: true },
    { left: '$', right: '$', display: false },
    { left: '\\(', right: '\\)', display: false },
    { left: '\\[', right: '\\]', display: true },
  ],
};

/** The user guide: docs/*.md rendered with ngx-markdown and KaTeX, with a page menu and contents. */
@Component({
  selector: 'tl-help-page',
  imports: [MarkdownComponent, MatIconModule, MatListModule, MatProgressBarModule, RouterLink],
  providers: [provideMarkdown()],
  templateUrl: './help-page.html',
  styleUrl: './help-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HelpPageView {
  private readonly http = inject(HttpClient);
  private readonly host = inject(ElementRef<HTMLElement>);

  /** Route `help/:page`; empty = the first page. */
  readonly page = input<string>();

  protected readonly pages = signal<HelpPage[] | null>(null);
  protected readonly text = signal<string | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly toc = signal<TocEntry[]>([]);
  protected readonly current = computed((): HelpPage | null => {
    const pages = this.pages() ?? [];
    return pages.find((p) => p.slug === this.page()) ?? pages[0] ?? null;
  });
  protected readonly katexOptions = KATEX_OPTIONS;

  constructor() {
    ensureKatexStyles();
    this.discover();
    effect(() => {
      const page = this.current();
      if (page) this.load(page.slug);
    });
  }

  protected onReady(): void {
    const article = this.host.nativeElement.querySelector('article') as HTMLElement | null;
    this.toc.set(article ? buildToc(article) : []);
  }

  protected jump(event: Event, id: string): void {
    event.preventDefault();
    const target = this.host.nativeElement.querySelector(
      `#${CSS.escape(id)}`,
    ) as HTMLElement | null;
    target?.scrollIntoView({ block: 'start' });
    target?.setAttribute('tabindex', '-1');
    target?.focus({ preventScroll: true });
  }

  private discover(): void {
    const seen = new Set<string>();
    forkJoin(
      HELP_PAGES.map((p) =>
        this.http.get(`/docs/${p.slug}.md`, { responseType: 'text' }).pipe(
          map((body) => (isHtmlFallback(body) ? null : p)),
          catchError(() => of(null)),
        ),
      ),
    ).subscribe((found) => {
      const pages = found.filter((p): p is HelpPage => {
        if (!p || seen.has(p.title)) return false;
        seen.add(p.title);
        return true;
      });
      this.pages.set(pages);
      if (pages.length === 0) this.error.set('No guide pages were shipped with this build.');
    });
  }

  private load(slug: string): void {
    this.text.set(null);
    this.error.set(null);
    this.toc.set([]);
    this.http.get(`/docs/${slug}.md`, { responseType: 'text' }).subscribe({
      next: (body) => {
        if (isHtmlFallback(body)) this.error.set('This guide page does not exist.');
        else this.text.set(body);
      },
      error: () => this.error.set('This guide page could not be loaded.'),
    });
  }
}
