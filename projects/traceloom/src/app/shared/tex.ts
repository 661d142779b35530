import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { DomSanitizer } from '@angular/platform-browser';
import { renderTex } from './katex-setup';

/**
 * A formula typeset with KaTeX. KaTeX's MathML copy keeps it readable to screen readers; `label`
 * gives an additional plain-text reading where the formula needs one.
 */
@Component({
  selector: 'tl-tex',
  template: '<span class="tex" [innerHTML]="html()"></span>',
  styles: ':host { display: inline; } :host(.block) { display: block; overflow-x: auto; }',
  host: { '[class.block]': 'display()' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Tex {
  readonly tex = input.required<string>();
  readonly display = input(false);

  private readonly sanitizer = inject(DomSanitizer);

  // KaTeX escapes its input (trust is off), and its output needs style attributes and MathML,
  // which Angular's generic sanitizer would strip.
  protected readonly html = computed(() =>
    this.sanitizer.bypassSecurityTrustHtml(renderTex(this.tex(), this.display())),
  );
}
