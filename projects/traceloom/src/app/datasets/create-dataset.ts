import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router } from '@angular/router';
import { datasetCreateSchema, may } from '@traceloom/shared/api';
import { messageOf } from '../core/api-error';
import { Session } from '../core/session';
import { DatasetsApi } from './datasets-api';

/**
 * "Make a dataset" for a finished run: a title field and a button; creates the draft snapshot
 * and opens its page. Shown only to authors, stewards and admins.
 */
@Component({
  selector: 'tl-create-dataset',
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    @if (allowed()) {
      @if (!open()) {
        <button
          mat-stroked-button
          type="button"
          (click)="open.set(true)"
          data-testid="dataset-create-open"
        >
          <mat-icon aria-hidden="true" fontIcon="inventory_2" /> Make a dataset
        </button>
      } @else {
        <form class="create" (submit)="$event.preventDefault(); create()">
          <mat-form-field subscriptSizing="dynamic">
            <mat-label>Dataset title</mat-label>
            <input
              matInput
              [value]="title()"
              (input)="title.set($any($event.target).value)"
              data-testid="dataset-create-title"
            />
          </mat-form-field>
          <button
            mat-flat-button
            type="submit"
            [disabled]="busy()"
            data-testid="dataset-create-submit"
          >
            Create draft
          </button>
          <button mat-button type="button" (click)="open.set(false)">Cancel</button>
        </form>
        @if (error(); as e) {
          <p class="error" role="alert">{{ e }}</p>
        }
      }
    }
  `,
  styles: `
    .create {
      display: flex;
      gap: 8px;
      align-items: center;
      flex-wrap: wrap;
    }
    .create mat-form-field {
      min-width: 280px;
    }
    .error {
      color: var(--mat-sys-error);
      margin: 4px 0 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreateDataset {
  private readonly api = inject(DatasetsApi);
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  /** The finished run to snapshot. */
  readonly runId = input.required<string>();
  /** A title to start from (e.g. the gas's). */
  readonly suggestedTitle = input('');

  protected readonly open = signal(false);
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly title = signal('');

  protected allowed(): boolean {
    return may(this.session.role(), 'makeDatasets');
  }

  protected create(): void {
    const parsed = datasetCreateSchema.safeParse({ title: this.title() || this.suggestedTitle() });
    if (!parsed.success) {
      this.error.set(`Title: ${parsed.error.issues[0]?.message ?? 'invalid'}.`);
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.api.create(this.runId(), parsed.data).subscribe({
      next: (d) => void this.router.navigate(['/datasets', d.id]),
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(messageOf(err));
      },
    });
  }
}
