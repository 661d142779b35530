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
 * `notFound` says it, after the `errorPrefix` sentence) with whatever the page projects as
 * `[stateAction]`, the empty sentence (or the page's `[stateEmpty]` content), else the projected
 * content. Projected content is created even while hidden: read the resource's value through a
 * `hasValue()` guard there.
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
          <p>{{ errorLine() }}</p>
          <ng-content select="[stateAction]" />
        </div>
      }
      @case ('empty') {
        <div class="state empty" [attr.data-testid]="testId() + '-empty'">
          <mat-icon aria-hidden="true" [fontIcon]="emptyIcon()" />
          <p>
            <ng-content select="[stateEmpty]">{{ emptyText() }}</ng-content>
          </p>
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
  /** A sentence before the error's own words, e.g. "The runs could not be loaded:". */
  readonly errorPrefix = input<string | null>(null);
  /**
   * The words for any failure but a 404 with `notFound`, for a read whose errors are not the
   * API's sentences (a static file).
   */
  readonly errorText = input<string | null>(null);
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
    if (err && this.errorText()) return this.errorText();
    return err ? messageOf(err) : 'Nothing could be read.';
  });

  protected readonly errorLine = computed(() => {
    const prefix = this.errorPrefix();
    return prefix ? `${prefix} ${this.message()}` : this.message();
  });
}
