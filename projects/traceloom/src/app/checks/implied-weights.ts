import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { valueTex, verdictText } from '@traceloom/shared/format';
import { Tex } from '../shared/tex';
import type { SeriesJson } from './series-diff';
import { SeriesSideBySide } from './series-side-by-side';

/** One implied-weight verdict as results and comparisons give it. */
export interface ImpliedWeightRow {
  L: number;
  agrees: boolean | null;
  agreesBelow?: string | null;
  firstMismatch?: unknown;
  /** false: the supplied side does not determine this Z_L ("not compared"). */
  determined?: boolean;
  implied?: unknown;
}

/**
 * The Z_L implied by something supplied (a grand function's logarithm, a reference table's rows)
 * beside the entered ones, L by L; a differing one also term by term. "Not compared" where the
 * supplied side does not determine Z_L.
 */
@Component({
  selector: 'tl-implied-weights',
  imports: [MatIconModule, SeriesSideBySide, Tex],
  templateUrl: './implied-weights.html',
  styleUrl: './implied-weights.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImpliedWeights {
  readonly rows = input.required<readonly ImpliedWeightRow[]>();
  /** The run's entered Z_L by L. */
  readonly entered = input.required<ReadonlyMap<number, unknown>>();
  readonly variable = input('q');
  /** What implies them, as the column header says it ("Implied by log Ξ"). */
  readonly source = input.required<string>();
  /** The same, inside a sentence ("implied by the supplied Ξ"), for the term-by-term view. */
  readonly phrase = input.required<string>();
  /** The table's accessible name. */
  readonly label = input('Implied weights');
  readonly testId = input('implied-weights');

  protected readonly valueTex = valueTex;

  protected impliedOf(w: ImpliedWeightRow): SeriesJson | null {
    const implied = w.implied as SeriesJson | undefined;
    return implied && Array.isArray(implied.terms) ? implied : null;
  }

  protected enteredOf(L: number): SeriesJson | null {
    const v = this.entered().get(L) as SeriesJson | undefined;
    return v && Array.isArray(v.terms) ? v : null;
  }

  protected tex(v: unknown): string {
    return valueTex(v as Parameters<typeof valueTex>[0], this.variable(), 5);
  }

  /** A verdict in words (numeric ones state their tolerance). */
  protected text(w: ImpliedWeightRow): string {
    return verdictText(w as unknown as Parameters<typeof verdictText>[0], this.variable());
  }
}
