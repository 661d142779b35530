import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  inject,
  input,
  linkedSignal,
} from '@angular/core';
import { MatListModule } from '@angular/material/list';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { MarkdownComponent, provideMarkdown } from 'ngx-markdown';
import { AsyncState } from '../shared/async-state';
import { ensureKatexStyles } from '../shared/katex-setup';
import { HelpApi } from './help-api';
import { HelpPage, TocEntry, buildToc } from './help-pages';

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
  imports: [AsyncState, MarkdownComponent, MatListModule, MatProgressBarModule, RouterLink],
  providers: [provideMarkdown()],
  templateUrl: './help-page.html',
  styleUrl: './help-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HelpPageView {
  private readonly api = inject(HelpApi);
  private readonly host = inject(ElementRef<HTMLElement>);

  /** Route `help/:page`; empty = the first page. */
  readonly page = input<string>();

  protected readonly pages = this.api.pagesResource();
  /** The shipped pages; null until they are known (or when none was shipped). */
  protected readonly pageList = computed(() => (this.pages.hasValue() ? this.pages.value() : null));
  protected readonly current = computed((): HelpPage | null => {
    const pages = this.pageList() ?? [];
    return pages.find((p) => p.slug === this.page()) ?? pages[0] ?? null;
  });
  protected readonly text = this.api.pageResource(() => this.current()?.slug);
  /** The rendered page's headings: none until it has rendered, again for each page. */
  protected readonly toc = linkedSignal<string | undefined, TocEntry[]>({
    source: () => this.current()?.slug,
    computation: () => [],
  });
  protected readonly katexOptions = KATEX_OPTIONS;

  constructor() {
    ensureKatexStyles();
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
}
