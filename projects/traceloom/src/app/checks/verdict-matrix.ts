import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { verdictText } from '@traceloom/shared/format';
import { CellState, VerdictLike, cellState, matrixExponents } from './verdict-cells';

const SYMBOL: Record<CellState, string> = { agrees: '✓', differs: '✗', unchecked: '·' };
const WORD: Record<CellState, string> = {
  agrees: 'agrees',
  differs: 'differs',
  unchecked: 'not determined or not compared',
};

/**
 * An N × exponent matrix of a check. Each cell carries its state three ways: a shape (filled
 * square, outlined square with a cross, small dot), a symbol and a label, as well as a colour.
 */
@Component({
  selector: 'tl-verdict-matrix',
  imports: [MatIconModule],
  templateUrl: './verdict-matrix.html',
  styleUrl: './verdict-matrix.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VerdictMatrix {
  readonly rows = input.required<readonly VerdictLike[]>();
  readonly step = input('1');
  readonly order = input<string | null>(null);
  readonly variable = input('q');
  readonly caption = input('Check matrix');

  protected readonly exponents = computed(() =>
    matrixExponents(this.step(), this.order(), this.rows()),
  );
  protected readonly grid = computed(() =>
    this.rows().map((row) => ({
      row,
      cells: this.exponents().map((e) => cellState(row, e)),
      text: verdictText(row, this.variable()),
    })),
  );
  protected readonly mismatches = computed(() =>
    this.rows()
      .filter((r) => r.firstMismatch !== null)
      .slice(0, 5),
  );
  protected readonly symbol = SYMBOL;
  protected readonly word = WORD;
  protected readonly verdictText = verdictText;
}
