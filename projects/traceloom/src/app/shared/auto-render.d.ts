// KaTeX ships no types for its auto-render extension; this is the part Traceloom uses.
declare module 'katex/contrib/auto-render' {
  import type { KatexOptions } from 'katex';

  interface Delimiter {
    left: string;
    right: string;
    display: boolean;
  }

  export default function renderMathInElement(
    element: HTMLElement,
    options?: KatexOptions & { delimiters?: Delimiter[]; ignoredTags?: string[] },
  ): void;
}
