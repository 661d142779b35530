import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { compute } from '@traceloom/shared/engine';
import { LATEX_PACKAGES, renderLatex } from '@traceloom/shared/format';
import { afterAll, describe, expect, it } from 'vitest';
import { datasetLatex } from '../datasets/dataset-document.js';

// A long series (order 60: Z(1) has 60 terms) and a class table with fractions; a numeric table
// with a closed form; a dataset heading with LaTeX's special characters in its title.
const series = compute({
  format: 'traceloom.gas/1',
  title: 'trap_1 & 50% #2',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '60',
  nMax: 5,
  classTable: 4,
  weights: { kind: 'formula', expression: 'q^(L/2) / (1 - q^L)' },
});
const numeric = compute({
  format: 'traceloom.gas/1',
  statistics: 'fermion',
  variable: 'q',
  precision: 20,
  at: { q: '1/10' },
  nMax: 4,
  classTable: 2,
  recognize: { basis: ['1'] },
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
});
const exports = {
  series: renderLatex(series),
  numeric: renderLatex(numeric),
  dataset: datasetLatex(
    { title: 'trap_1 & 50% #2 {x}', version: 2, lockedAt: null, hash: null },
    series,
  ),
};

/** Names of environments begun and ended, in order. */
function environments(tex: string): string[] {
  return [...tex.matchAll(/\\(begin|end)\{([^}]+)\}/g)].map((m) => `${m[1]} ${m[2]}`);
}

const pdflatex = spawnSync('pdflatex', ['--version'], { encoding: 'utf8' }).status === 0;
const dir = mkdtempSync(join(tmpdir(), 'traceloom-latex-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('LaTeX exports', () => {
  it.each(Object.entries(exports))('%s: environments nest and long series break', (_, tex) => {
    const stack: string[] = [];
    for (const e of environments(tex)) {
      const [kind, name] = e.split(' ');
      if (kind === 'begin') stack.push(name!);
      else expect(stack.pop()).toBe(name);
    }
    expect(stack).toEqual([]);
    expect(tex).toContain(`% needs ${LATEX_PACKAGES}`);
    // no display line carries more than a line's worth of terms
    for (const line of tex.split('\n').filter((l) => l.startsWith('Z(') || l.startsWith('  &'))) {
      expect(line.length).toBeLessThan(160);
    }
  });

  it('breaks Z(1) of the trap (60 terms) over several lines and writes cycle types in maths', () => {
    const z1 = exports.series.split('\n').findIndex((l) => l.startsWith('Z(1) &='));
    expect(exports.series.split('\n')[z1 + 1]).toMatch(/^ {2}&\\quad \+ q\^\{/);
    expect(exports.series).toContain('& $1^{2}\\,2^{1}$ & $6$ & $-$ & ');
    expect(exports.series).toContain('\\tfrac{1}{24}');
    expect(exports.dataset).toMatch(/^% trap_1 & 50% #2 \{x\}, version 2, not locked$/m);
  });

  // Compiles each export in a plain article with only the packages it names (Debian's TeX Live,
  // texlive-latex-base: amsmath and the tools bundle's longtable).
  it.runIf(pdflatex).each(Object.entries(exports))('%s compiles with pdflatex', (name, tex) => {
    const file = join(dir, `${name}.tex`);
    writeFileSync(
      file,
      `\\documentclass{article}\n${LATEX_PACKAGES}\n\\begin{document}\n${tex}\\end{document}\n`,
    );
    const r = spawnSync(
      'pdflatex',
      ['-interaction=nonstopmode', '-halt-on-error', `-output-directory=${dir}`, file],
      { encoding: 'utf8', timeout: 60_000 },
    );
    expect(r.stdout.split('\n').filter((l) => l.startsWith('!'))).toEqual([]);
    expect(r.status).toBe(0);
  });
});
