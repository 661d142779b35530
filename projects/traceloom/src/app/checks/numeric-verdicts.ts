import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { NumericValueJson, numericText } from '@traceloom/shared/format';
import {
  numericVerdictText,
  type NumericVerdictJson as NumericVerdictLike,
} from '@traceloom/shared/format';

/** One numeric verdict row of a grand or reference check. */
export type NumericVerdictRow = NumericVerdictLike & {
  N: number;
  computed?: NumericValueJson;
  supplied?: NumericValueJson;
};

/**
 * A numeric grand or reference check, row by row: computed and supplied values (determined
 * digits ± error), the verdict, and the tolerance each comparison was made within.
 */
@Component({
  selector: 'tl-numeric-verdicts',
  imports: [MatIconModule],
  templateUrl: './numeric-verdicts.html',
  styleUrl: './run-checks.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NumericVerdicts {
  readonly rows = input.required<readonly NumericVerdictRow[]>();
  readonly caption = input('Numeric check');

  protected readonly verdictText = numericVerdictText;
  protected value(v: NumericValueJson | undefined): string {
    return v ? numericText(v, true) : '—';
  }
}
