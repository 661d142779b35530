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
    expect(cells[6]).toContain('agrees: Newton recursion, class sum');
  });

  it('says how many sectors made each row of a sector sum', async () => {
    await render([0, 1, 2].map((N) => ({ ...trapRow(N), sectors: N === 0 ? 0 : 10 + N })));
    expect(el.querySelector('[data-testid="canonical-sectors-0"]')?.textContent).toContain(
      'by convention',
    );
    expect(el.querySelector('[data-testid="canonical-sectors-2"]')?.textContent?.trim()).toBe('12');
  });

  it('has no sectors column outside sector mode', async () => {
    await render([trapRow(0), trapRow(1)]);
    expect(el.querySelector('[data-testid="canonical-sectors-1"]')).toBeNull();
  });

  it('shows a row beyond the order as not determined, its routes not compared (never 0)', async () => {
    // Z(7) of the trap starts at q^(49/2), beyond O(q^20): no coefficient is known
    const beyond: CanonicalRowJson = {
      N: 7,
      value: { order: '20', terms: [] },
      routes: ['recursion', 'classSum'],
      agrees: null,
      determined: false,
    };
    await render([trapRow(0), trapRow(1), beyond]);
    const lead = el.querySelector('[data-testid="canonical-lead-7"]');
    expect(lead?.getAttribute('data-plain')).toBe('not determined');
    const cells = [...el.querySelectorAll('[data-testid="canonical-row-7"] td')].map((td) =>
      td.textContent?.trim(),
    );
    expect(cells[3]).toBe('—');
    expect(cells[6]).toContain('not compared (not determined)');
    expect(cells.join(' ')).not.toMatch(/agree:/);
  });

  it('says in words when the routes disagree (not by colour alone)', async () => {
    await render([trapRow(0), trapRow(1), trapRow(2, false)]);
    const cell = el.querySelector('[data-testid="canonical-agree-2"]');
    expect(cell?.textContent).toContain('differs: Newton recursion');
    // the icon is decoration drawn from its fontIcon attribute: no ligature name in the text
    const icon = cell?.querySelector('mat-icon');
    expect(icon?.getAttribute('fontIcon')).toBe('report');
    expect(icon?.getAttribute('aria-hidden')).toBe('true');
    expect(icon?.textContent?.trim()).toBe('');
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

/**
 * A numeric fixture in the result format: the line kernel rho(x,y) of the numeric-mode contract,
 * Z(1) = 1/(16 pi) = 1.98943678864869169711104704e-2 (mpmath 1.3, independent), with two routes
 * and a recognized closed form; Z(2) with nothing determined ("0 ± e"), a note instead of a form.
 */
const NUMERIC_ROWS = [
  { N: 0, value: { real: '1', error: '0' }, routes: ['recursion'], agrees: true },
  {
    N: 1,
    value: { real: '1.98943678864869169711104704e-2', error: '3e-30' },
    routes: ['recursion', 'fredholm'],
    agrees: true,
    routeValues: {
      recursion: { real: '1.98943678864869169711104704e-2', error: '3e-30' },
      fredholm: { real: '1.9894367886486916971110470e-2', error: '8e-29' },
    },
    recognized: {
      expression: '1/(16*pi)',
      latex: '\\frac{1}{16\\pi}',
      height: 16,
      digitsToSpare: 24,
    },
  },
  {
    N: 2,
    value: { real: '0', error: '2e-3' },
    routes: ['recursion', 'fredholm'],
    agrees: false,
    recognized: null,
    recognizeNote: 'no relation of height <= 1000000 at this precision',
  },
] as unknown as CanonicalRowJson[];

describe('CanonicalTable in numeric mode', () => {
  let fixture: ComponentFixture<CanonicalTable>;
  let el: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [CanonicalTable], providers: testProviders() });
    fixture = TestBed.createComponent(CanonicalTable);
    fixture.componentRef.setInput('rows', NUMERIC_ROWS);
    el = fixture.nativeElement;
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 50));
    await fixture.whenStable();
  });

  const text = (id: string) => el.querySelector(`[data-testid="${id}"]`)?.textContent?.trim();

  it('shows determined digits grouped in fives, the error, and never an undetermined digit', () => {
    expect(text('canonical-digits-1')).toBe('0.01989 43678 86486 91697 11104 704');
    expect(text('canonical-error-1')).toBe('± 3e-30');
    expect(text('canonical-digits-2')).toBe('0');
    expect(text('canonical-error-2')).toBe('± 2e-3');
    expect(text('canonical-error-0')).toBe('exact');
    // no series columns in numeric mode
    expect(el.querySelector('[data-testid="canonical-lead-1"]')).toBeNull();
  });

  it('puts the closed form beside Z(N) with its height and margin, or the note', () => {
    const rec = el.querySelector('[data-testid="canonical-recognized-1"]');
    expect(rec?.querySelector('.katex')).not.toBeNull();
    expect(rec?.textContent).toContain('height 16, 24 digits to spare');
    expect(text('canonical-recognized-2')).toContain('no relation of height <= 1000000');
    expect(text('canonical-agree-2')).toContain('differs: Newton recursion');
  });

  it("expands a row to each route's value and error and their agreement", async () => {
    (el.querySelector('[data-testid="canonical-expand-1"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    const fredholm = el.querySelector('[data-testid="canonical-route-1-fredholm"]');
    expect(fredholm?.textContent).toContain('Fredholm determinant');
    expect(fredholm?.textContent).toContain('0.01989 43678 86486 91697 11104 70');
    expect(fredholm?.textContent).toContain('8e-29');
    expect(text('canonical-routes-verdict-1')).toContain('agree within their combined errors');
    expect(el.querySelector('[data-testid="canonical-detail-1"] .plain code')?.textContent).toBe(
      '0.0198943678864869169711104704 ± 3e-30',
    );
  });
});
