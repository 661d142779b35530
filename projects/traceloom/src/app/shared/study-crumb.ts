import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { RouterLink } from '@angular/router';

/**
 * The breadcrumb link to a study, named by the study's title (read from the API). Until the
 * title arrives it shows a quiet bar (no placeholder word); when the study cannot be read, the
 * link is to the studies list and says so.
 */
@Component({
  selector: 'tl-study-crumb',
  imports: [RouterLink],
  template: `@switch (state()) {
    @case ('loaded') {
      <a [routerLink]="['/studies', studyId()]">{{ title() }}</a>
    }
    @case ('loading') {
      <span class="tl-skeleton" role="status" aria-label="Loading the study's name"></span>
    }
    @default {
      <a routerLink="/studies">Studies</a>
    }
  }`,
  styles: ':host { display: contents; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyCrumb {
  private readonly http = inject(HttpClient);

  readonly studyId = input<string | null | undefined>(null);

  protected readonly title = signal<string | null>(null);
  protected readonly state = signal<'loading' | 'loaded' | 'unknown'>('loading');

  constructor() {
    effect(() => {
      const id = this.studyId();
      this.title.set(null);
      if (!id) {
        this.state.set('unknown');
        return;
      }
      this.state.set('loading');
      this.http.get<{ title: string }>(`/api/studies/${encodeURIComponent(id)}`).subscribe({
        next: (s) => {
          this.title.set(s.title);
          this.state.set('loaded');
        },
        error: () => this.state.set('unknown'),
      });
    });
  }
}
