import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterLink } from '@angular/router';

/**
 * The link from an expression field to the guide's page on the expression language; it opens
 * in a new tab, so the form being filled in stays as it is.
 */
@Component({
  selector: 'tl-syntax-link',
  imports: [RouterLink],
  template: `<a
    routerLink="/help/spec"
    fragment="the-expression-language"
    target="_blank"
    rel="noopener"
    class="syntax"
    >Syntax</a
  >`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SyntaxLink {}
