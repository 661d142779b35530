import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { CanonicalLine } from '../shared/canonical-rows';
import { Tex } from '../shared/tex';

/**
 * The expanded detail of a numeric canonical row: each route's own value and error, whether they
 * agree within their combined errors, and the recognized closed form (or why there is none).
 */
@Component({
  selector: 'tl-numeric-row-detail',
  imports: [MatIconModule, Tex],
  templateUrl: './numeric-row-detail.html',
  styleUrl: './numeric-row-detail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NumericRowDetail {
  readonly line = input.required<CanonicalLine>();
}
