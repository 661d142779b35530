import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { downloadText, fileStem, toJson } from './export-files';

/**
 * CSV, JSON and LaTeX download buttons for the table on screen (and the coefficient matrix when
 * the table has one). The texts come from `@traceloom/shared/format` through the callers, so a
 * download from the screen is the same file as from the CLI or the dataset export.
 */
@Component({
  selector: 'tl-export-buttons',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <div class="exports" role="group" [attr.aria-label]="'Export ' + label()">
      <span class="what">Export {{ label() }}:</span>
      <button
        mat-stroked-button
        type="button"
        (click)="csv()"
        [attr.data-testid]="testId() + '-csv'"
      >
        <mat-icon aria-hidden="true" fontIcon="table_view" /> CSV
      </button>
      <button
        mat-stroked-button
        type="button"
        (click)="json()"
        [attr.data-testid]="testId() + '-json'"
      >
        <mat-icon aria-hidden="true" fontIcon="data_object" /> JSON
      </button>
      <button
        mat-stroked-button
        type="button"
        (click)="latex()"
        [attr.data-testid]="testId() + '-latex'"
      >
        <mat-icon aria-hidden="true" fontIcon="functions" /> LaTeX
      </button>
      @if (matrix(); as m) {
        <button
          mat-stroked-button
          type="button"
          (click)="download(m(), 'matrix.csv', 'text/csv')"
          [attr.data-testid]="testId() + '-matrix'"
        >
          <mat-icon aria-hidden="true" fontIcon="grid_on" /> Coefficient matrix
        </button>
      }
    </div>
  `,
  styles: `
    .exports {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 8px;
    }
    .what {
      font: var(--mat-sys-label-large);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ExportButtons {
  /** What is exported, in words (`canonical table`). */
  readonly label = input.required<string>();
  /** The base of the file names. */
  readonly title = input.required<string>();
  /** The CSV text of the table (called on click). */
  readonly csvText = input.required<() => string>();
  /** The LaTeX text of the table (called on click). */
  readonly latexText = input.required<() => string>();
  /** The coefficient matrix N x exponent as CSV, when the table has one. */
  readonly matrix = input<(() => string) | null>(null);
  /** What the JSON download holds (the result itself, not the screen's text). */
  readonly data = input.required<unknown>();
  readonly testId = input('export');

  protected csv(): void {
    this.download(this.csvText()(), 'csv', 'text/csv');
  }

  protected json(): void {
    this.download(toJson(this.data()), 'json', 'application/json');
  }

  protected latex(): void {
    this.download(this.latexText()(), 'tex', 'application/x-tex');
  }

  protected download(text: string, extension: string, type: string): void {
    downloadText(text, `${fileStem(this.title())}.${extension}`, type);
  }
}
