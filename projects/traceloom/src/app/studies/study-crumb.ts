import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { RouterLink } from '@angular/router';

/**
 * The breadcrumb link to a study, named by the study's title (read from the API); "the study"
 * until the title arrives or when it cannot be read.
 */
@Component({
  selector: 'tl-study-crumb',
  imports: [RouterLink],
  template: `<a [routerLink]="studyId() ? ['/studies', studyId()] : ['/studies']">{{
    title() ?? 'the study'
  }}</a>`,
  styles: ':host { display: contents; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyCrumb {
  private readonly http = inject(HttpClient);

  readonly studyId = input<string | null | undefined>(null);

  protected readonly title = signal<string | null>(null);

  constructor() {
    effect(() => {
      const id = this.studyId();
      this.title.set(null);
      if (!id) return;
      this.http.get<{ title: string }>(`/api/studies/${encodeURIComponent(id)}`).subscribe({
        next: (s) => this.title.set(s.title),
        error: () => undefined,
      });
    });
  }
}
