import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { ExportTable, downloadText, fileStem, toCsv, toJson, toLatexTable } from './export-files';

/** CSV, JSON and LaTeX download buttons for the table on screen. */
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
        <mat-icon aria-hidden="true">table_view</mat-icon> CSV
      </button>
      <button
        mat-stroked-button
        type="button"
        (click)="json()"
        [attr.data-testid]="testId() + '-json'"
      >
        <mat-icon aria-hidden="true">data_object</mat-icon> JSON
      </button>
      <button
        mat-stroked-button
        type="button"
        (click)="latex()"
        [attr.data-testid]="testId() + '-latex'"
      >
        <mat-icon aria-hidden="true">functions</mat-icon> LaTeX
      </button>
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
  readonly table = input.required<ExportTable>();
  /** What the JSON download holds (the result itself, not the screen's text). */
  readonly data = input.required<unknown>();
  /** Columns that hold LaTeX maths in `latexTable`. */
  readonly latexTable = input<ExportTable | null>(null);
  readonly mathColumns = input<number[]>([]);
  readonly testId = input('export');

  protected csv(): void {
    downloadText(toCsv(this.table()), `${fileStem(this.title())}.csv`, 'text/csv');
  }

  protected json(): void {
    downloadText(toJson(this.data()), `${fileStem(this.title())}.json`, 'application/json');
  }

  protected latex(): void {
    const text = toLatexTable(this.latexTable() ?? this.table(), {
      caption: this.title(),
      mathColumns: this.mathColumns(),
    });
    downloadText(text, `${fileStem(this.title())}.tex`, 'application/x-tex');
  }
}
