import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { LargeNJson } from '@traceloom/shared/engine';
import { testProviders } from '../core/session-testing';
import { TRAP_LARGE_N } from './large-n-fixture';
import { classRows, formulaTex, largeNExportTable, linearAt } from './large-n-format';
import { LargeNPanel } from './large-n-panel';

describe('LargeNPanel', () => {
  let fixture: ComponentFixture<LargeNPanel>;
  let el: HTMLElement;

  async function render(largeN: Partial<LargeNJson> | undefined): Promise<void> {
    TestBed.configureTestingModule({ imports: [LargeNPanel], providers: testProviders() });
    fixture = TestBed.createComponent(LargeNPanel);
    fixture.componentRef.setInput('result', { largeN });
    fixture.componentRef.setInput('title', 'trap');
    el = fixture.nativeElement;
    await fixture.whenStable();
  }
  const text = (id: string) => el.querySelector(`[data-testid="${id}"]`)?.textContent ?? '';

  it('shows the normalization, the limit with its product exponents and the walls', async () => {
    await render(TRAP_LARGE_N);
    expect(text('largen-normalization')).toContain('fitted on rows 1, 2, 3');
    expect(text('largen-normalization')).toContain('verified on rows 4, 5, 6');
    // 1/(q;q)_inf: a_n = 1 (OEIS A000041 as its coefficients)
    expect(text('largen-product')).toContain('a(1) = 1');
    expect(text('largen-pattern')).toContain('a_n = 1');
    expect(text('largen-stabilization')).toContain('verified on 3, 4');
    expect(text('largen-wall-all-1')).toContain('1, 2');
    expect(text('largen-wall-all-3')).toContain('not found');
    // rows: N = 2 agrees below 3, N = 6 only a bound
    expect(text('largen-row-all-2')).toContain('3');
    expect(text('largen-row-all-6')).toContain('≥ 6');
    expect(el.querySelector('[data-testid="largen-export-csv"]')).not.toBeNull();
    expect(el.querySelector('[data-testid="largen-plot-stab-all"] canvas')).not.toBeNull();
  });

  it.each([
    ['no block', undefined],
    ['a block without the series analysis (numeric mode)', {}],
  ])('says so when the run has %s', async (_what, block) => {
    await render(block);
    expect(text('largen-empty')).toContain('no large-N analysis');
  });
});

describe('large-N formatting', () => {
  it.each([
    ['q^(-N^2/2)', 'q^{-N^{2}/2}'],
    ['3*N^2/2 - 1', '3\\,N^{2}/2 - 1'],
  ])('formulaTex(%s)', (input, tex) => {
    expect(formulaTex(input)).toBe(tex);
  });

  it.each([
    ['N + 1', 5, 6],
    ['N/2 + 1/2', 3, 2],
    ['3*N/2 - 1', 2, 2],
    ['-N + 3', 1, 2],
    ['2', 9, 2],
  ])('linearAt(%s, %d) = %d', (expr, N, y) => {
    expect(linearAt(expr, N)).toBe(y);
  });

  it('export table: one line per class and N, bounds written >= in CSV and \\geq in LaTeX', () => {
    const csv = largeNExportTable(TRAP_LARGE_N);
    expect(csv.columns).toEqual(['class', 'N', 'agrees below', 'Z(N)/Z(inf) - 1']);
    expect(csv.rows[0]!.slice(0, 3)).toEqual(['all', '1', '2']);
    expect(csv.rows[5]![2]).toBe('>= 6');
    expect(largeNExportTable(TRAP_LARGE_N, true).rows[5]![2]).toBe('\\geq 6');
    expect(classRows(TRAP_LARGE_N.classes[0]!, 'q')[2]!.correction).toMatch(/^-q\^4/);
  });
});
