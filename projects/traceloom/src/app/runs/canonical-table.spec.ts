import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { CanonicalRowJson } from '@traceloom/shared/engine';
import { CanonicalTable } from './canonical-table';
import { testProviders } from '../core/session-testing';

/**
 * Harmonic trap, fermions, Z_L = q^(L/2)/(1-q^L): Z(N) = q^(N^2/2)/(q;q)_N (Andrews, The Theory
 * of Partitions, Cor. 2.2), so Z(1) = q^(1/2) + q^(3/2) + ..., Z(3) starts at q^(9/2).
 */
function trapRow(N: number, agrees = true): CanonicalRowJson {
  const lead = (N * N) / 2;
  const e = (k: number) => (Number.isInteger(lead + k) ? `${lead + k}` : `${2 * (lead + k)}/2`);
  return {
    N,
    value: {
      order: '20',
      terms:
        N === 0
          ? [['0', '1']]
          : [
              [e(0), '1'],
              [e(1), '1'],
              [e(2), '2'],
            ],
    },
    routes: N <= 4 ? ['recursion', 'classSum'] : ['recursion'],
    agrees,
  };
}

describe('CanonicalTable', () => {
  let fixture: ComponentFixture<CanonicalTable>;
  let el: HTMLElement;

  async function render(rows: CanonicalRowJson[]): Promise<void> {
    TestBed.configureTestingModule({
      imports: [CanonicalTable],
      providers: testProviders(),
    });
    fixture = TestBed.createComponent(CanonicalTable);
    fixture.componentRef.setInput('rows', rows);
    el = fixture.nativeElement;
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 50));
    await fixture.whenStable();
  }

  const rowsShown = () => el.querySelectorAll('tr[data-testid^="canonical-row-"]');

  it('shows one row per N with leading term, valuation, term count, order and agreement', async () => {
    await render([0, 1, 2, 3].map((n) => trapRow(n)));
    expect(rowsShown().length).toBe(4);
    const lead3 = el.querySelector('[data-testid="canonical-lead-3"]');
    expect(lead3?.getAttribute('data-plain')).toBe('q^(9/2)');
    expect(lead3?.querySelector('.katex')).not.toBeNull();
    const row3 = el.querySelector('[data-testid="canonical-row-3"]') as HTMLElement;
    const cells = [...row3.querySelectorAll('td')].map((td) => td.textContent?.trim());
    expect(cells[1]).toBe('3');
    expect(cells[3]).toBe('9/2');
    expect(cells[4]).toBe('3');
    expect(cells[5]).toBe('O(q^20)');
    expect(cells[6]).toContain('agree: Newton recursion, class sum');
  });

  it('says in words when the routes disagree (not by colour alone)', async () => {
    await render([trapRow(0), trapRow(1), trapRow(2, false)]);
    const cell = el.querySelector('[data-testid="canonical-agree-2"]');
    expect(cell?.textContent).toContain('DISAGREE');
    expect(cell?.querySelector('mat-icon')?.textContent?.trim()).toBe('report');
  });

  it('expands a row to the full series, typeset and as plain text', async () => {
    await render([0, 1, 2, 3].map((n) => trapRow(n)));
    expect(el.querySelector('[data-testid="canonical-detail-3"]')).toBeNull();
    const button = el.querySelector('[data-testid="canonical-expand-3"]') as HTMLButtonElement;
    expect(button.getAttribute('aria-expanded')).toBe('false');
    button.click();
    await fixture.whenStable();
    const detail = el.querySelector('[data-testid="canonical-detail-3"]');
    expect(detail?.querySelector('code')?.textContent).toBe(
      'q^(9/2) + q^(11/2) + 2*q^(13/2) + O(q^20)',
    );
    expect(detail?.querySelector('.katex-display')).not.toBeNull();
    expect(button.getAttribute('aria-expanded')).toBe('true');
  });

  it('renders only a window of a long table (virtual scrolling)', async () => {
    await render(Array.from({ length: 201 }, (_, n) => trapRow(n)));
    expect(el.querySelector('[data-testid="canonical-count"]')?.textContent).toContain('201 rows');
    const shown = rowsShown().length;
    expect(shown).toBeGreaterThan(0);
    expect(shown).toBeLessThan(201);
  });
});
