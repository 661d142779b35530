import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ApiError, messageOf } from '../core/api-error';

/** What the component reads of a resource (an `httpResource`, or anything shaped like one). */
export interface ResourceLike {
  isLoading(): boolean;
  hasValue(): boolean;
  error(): unknown;
}

/**
 * The loading, error and empty states of one read, in one place: a progress bar while the
 * first answer is awaited (a reload keeps the content on screen), the error in words (a 404 as
 * `notFound` says it) with whatever the page projects as `[stateAction]`, the empty sentence,
 * else the projected content.
 */
@Component({
  selector: 'tl-async-state',
  imports: [MatIconModule, MatProgressBarModule],
  template: `
    @switch (state()) {
      @case ('loading') {
        <mat-progress-bar mode="indeterminate" [attr.aria-label]="loadingLabel()" />
      }
      @case ('error') {
        <div class="state error" role="alert" [attr.data-testid]="testId() + '-error'">
          <mat-icon aria-hidden="true" fontIcon="error" />
          <p>{{ message() }}</p>
          <ng-content select="[stateAction]" />
        </div>
      }
      @case ('empty') {
        <div class="state empty" [attr.data-testid]="testId() + '-empty'">
          <mat-icon aria-hidden="true" [fontIcon]="emptyIcon()" />
          <p>{{ emptyText() }}</p>
        </div>
      }
      @default {
        <ng-content />
      }
    }
  `,
  styleUrl: './async-state.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AsyncState {
  readonly resource = input.required<ResourceLike>();
  /** True when the loaded value has nothing to show. */
  readonly empty = input(false);
  readonly emptyText = input('Nothing here yet.');
  readonly emptyIcon = input('inbox');
  readonly loadingLabel = input('Loading');
  /** The sentence for a 404 (hidden or missing), e.g. "This run does not exist, or ...". */
  readonly notFound = input<string | null>(null);
  /** Prefix of the test ids (`<testId>-error`, `<testId>-empty`). */
  readonly testId = input('state');

  protected readonly state = computed(() => {
    const r = this.resource();
    if (r.error()) return 'error';
    if (!r.hasValue()) return 'loading';
    return this.empty() ? 'empty' : 'value';
  });

  protected readonly message = computed(() => {
    const err = this.resource().error();
    if (err instanceof ApiError && err.status === 404 && this.notFound()) return this.notFound();
    return err ? messageOf(err) : 'Nothing could be read.';
  });
}
