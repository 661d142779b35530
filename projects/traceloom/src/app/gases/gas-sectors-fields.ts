import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { SyntaxLink } from '../shared/syntax-link';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { errorText } from './field-error';
import type { GasForm } from './gas-form';
import { MAX_SECTOR_INDICES, sectorIndexGroup } from './gas-sectors';

/** Names offered for a new index, in order (the user may rename them). */
const NEXT_NAMES = ['n', 'm', 'k'];

/**
 * The Sectors section of the gas editor: a sum over integer sector vectors n of gases whose weight
 * expressions may use the indices, with a range per index (an empty end is unbounded) and the
 * sector weight w(n).
 */
@Component({
  selector: 'tl-gas-sectors-fields',
  imports: [
    SyntaxLink,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSlideToggleModule,
  ],
  templateUrl: './gas-sectors-fields.html',
  styleUrl: './gas-numeric-fields.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GasSectorsFields {
  readonly form = input.required<GasForm>();
  readonly readOnly = input(false);

  protected readonly errorText = errorText;
  protected readonly maxIndices = MAX_SECTOR_INDICES;

  /** Adds an index row with a name not yet used. */
  protected addIndex(): void {
    const rows = this.form().controls.sectors.controls.indices;
    if (rows.length >= MAX_SECTOR_INDICES) return;
    const used = new Set(rows.getRawValue().map((r) => r.name.trim()));
    const name = NEXT_NAMES.find((n) => !used.has(n)) ?? `n${rows.length + 1}`;
    rows.push(sectorIndexGroup(name));
    rows.markAsDirty();
  }

  /** Removes index row k (one row always stays). */
  protected removeIndex(k: number): void {
    const rows = this.form().controls.sectors.controls.indices;
    if (rows.length <= 1) return;
    rows.removeAt(k);
    rows.markAsDirty();
  }
}
