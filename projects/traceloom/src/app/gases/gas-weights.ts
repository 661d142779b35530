import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { SyntaxLink } from '../shared/syntax-link';
import { errorText } from './field-error';
import { GasForm } from './gas-form';
import { LINE_KERNEL_EXAMPLE } from './gas-numeric';

/** The weight source (values list, formula in L, spectrum, kernel) and the optional grand function. */
@Component({
  selector: 'tl-gas-weights',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSlideToggleModule,
    SyntaxLink,
  ],
  templateUrl: './gas-weights.html',
  styleUrl: './gas-weights.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GasWeights {
  readonly form = input.required<GasForm>();
  readonly readOnly = input(false);

  protected readonly errorText = errorText;
  protected readonly lineKernel = LINE_KERNEL_EXAMPLE;

  protected addValue(): void {
    const rows = this.form().controls.values;
    rows.push(new FormControl('', { nonNullable: true }));
    this.form().markAsDirty();
  }

  /**
   * Pasting several lines into a value makes one row per line: the first replaces the pasted-into
   * text's selection, the rest become new rows after it. A single line pastes as usual.
   */
  protected pasteValues(index: number, event: ClipboardEvent): void {
    const lines = (event.clipboardData?.getData('text/plain') ?? '')
      .split(/\r?\n/)
      .map((line) => line.trim())
      .filter((line) => line !== '');
    if (lines.length < 2) return;
    event.preventDefault();
    const rows = this.form().controls.values;
    rows.at(index).setValue(lines[0]!);
    lines.slice(1).forEach((line, k) => {
      rows.insert(index + 1 + k, new FormControl(line, { nonNullable: true }));
    });
    this.form().markAsDirty();
  }

  protected removeValue(index: number): void {
    const rows = this.form().controls.values;
    if (rows.length > 1) rows.removeAt(index);
    this.form().markAsDirty();
  }
}
