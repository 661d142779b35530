import { ChangeDetectionStrategy, Component, input } from '@angular/core';

/** The Traceloom mark: two warp and two weft threads woven over and under. */
@Component({
  selector: 'tl-logo-mark',
  templateUrl: './logo-mark.html',
  styles: ':host { display: inline-flex; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LogoMark {
  readonly size = input(32);
}
