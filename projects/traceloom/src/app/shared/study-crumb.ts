import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { studyResource } from '../core/study-resource';

/**
 * The breadcrumb link to a study, named by the study's title (read from the API). Until the
 * title arrives it shows a quiet bar (no placeholder word); when the study cannot be read, the
 * link is to the studies list and says so. Its own small states (a crumb, not a page block), so
 * no tl-async-state.
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
  readonly studyId = input<string | null | undefined>(null);

  private readonly study = studyResource(() => this.studyId());
  protected readonly title = computed(() =>
    this.study.hasValue() ? this.study.value().title : null,
  );
  protected readonly state = computed((): 'loading' | 'loaded' | 'unknown' => {
    if (!this.studyId() || this.study.error()) return 'unknown';
    return this.study.hasValue() ? 'loaded' : 'loading';
  });
}
