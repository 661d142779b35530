import katex from 'katex';
import renderMathInElement from 'katex/contrib/auto-render';

/**
 * KaTeX for the lazily loaded screens. ngx-markdown looks for `katex` and `renderMathInElement`
 * on globalThis, so both are put there; the stylesheet and fonts are our own copy under /katex
 * (angular.json assets), linked on first use so the initial page never loads them.
 */
Object.assign(globalThis, { katex, renderMathInElement });

const STYLESHEET_ID = 'tl-katex-css';

/** Links KaTeX's stylesheet once (served locally from /katex). */
export function ensureKatexStyles(): void {
  if (typeof document === 'undefined' || document.getElementById(STYLESHEET_ID)) return;
  const link = document.createElement('link');
  link.id = STYLESHEET_ID;
  link.rel = 'stylesheet';
  link.href = '/katex/katex.min.css';
  document.head.appendChild(link);
}

/** LaTeX to HTML; a formula KaTeX cannot read is shown as its source text, never thrown. */
export function renderTex(tex: string, displayMode = false): string {
  ensureKatexStyles();
  return katex.renderToString(tex, { displayMode, throwOnError: false, output: 'htmlAndMathml' });
}

export { katex };
