import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { GasDto } from './gases-api';

/** The saved versions of a gas, newest first; choosing one shows it read-only. */
@Component({
  selector: 'tl-gas-versions',
  imports: [DatePipe, MatButtonModule, MatIconModule],
  template: `
    <section class="versions" aria-labelledby="versions-title">
      <h2 id="versions-title">Version history</h2>
      <ol data-testid="gas-versions">
        @for (v of newestFirst(); track v.version) {
          <li [class.current]="v.version === shown()">
            <button
              mat-button
              type="button"
              (click)="view.emit(v.version === gas().version ? null : v.version)"
              [attr.aria-pressed]="v.version === shown()"
              [attr.data-testid]="'gas-version-' + v.version"
            >
              @if (v.version === shown()) {
                <mat-icon aria-hidden="true" fontIcon="radio_button_checked" />
              } @else {
                <mat-icon aria-hidden="true" fontIcon="radio_button_unchecked" />
              }
              Version {{ v.version }}{{ v.version === gas().version ? ' (latest)' : '' }}
            </button>
            <span class="meta">
              {{ v.createdBy.displayName }},
              <time [attr.datetime]="v.createdAt">{{ v.createdAt | date: 'medium' }}</time>
            </span>
          </li>
        }
      </ol>
    </section>
  `,
  styles: `
    .versions {
      padding: 16px 20px;
      border-radius: var(--tl-radius);
      background: var(--mat-sys-surface-container-lowest);
      box-shadow: var(--mat-sys-level1);
    }
    h2 {
      font: var(--mat-sys-title-medium);
      margin: 0 0 8px;
    }
    ol {
      list-style: none;
      margin: 0;
      padding: 0;
      max-height: 240px;
      overflow-y: auto;
    }
    li {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 4px 8px;
    }
    li.current button {
      font-weight: 700;
    }
    .meta {
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GasVersions {
  readonly gas = input.required<GasDto>();
  /** The version on screen when it is not the latest. */
  readonly viewed = input<number | null>(null);
  /** The version chosen (null = the latest). */
  readonly view = output<number | null>();

  protected readonly newestFirst = computed(() =>
    [...this.gas().versions].sort((a, b) => b.version - a.version),
  );
  protected readonly shown = computed(() => this.viewed() ?? this.gas().version);
}
