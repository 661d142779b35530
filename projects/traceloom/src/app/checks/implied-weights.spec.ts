import { TestBed } from '@angular/core/testing';
import { testProviders } from '../core/session-testing';
import { ImpliedWeights, type ImpliedWeightRow } from './implied-weights';

const series = (order: string | null, terms: [string, string][]) => ({ order, terms });

describe('ImpliedWeights', () => {
  it('shows each implied Z_L beside the entered one, a differing one term by term, and says "not compared" where the table does not determine it', async () => {
    TestBed.configureTestingModule({ imports: [ImpliedWeights], providers: testProviders() });
    const fixture = TestBed.createComponent(ImpliedWeights);
    const entered = new Map<number, unknown>([
      [1, series(null, [['1', '1']])],
      [2, series('6', [['2', '1']])],
      [3, series('6', [['3', '1']])],
    ]);
    const rows: ImpliedWeightRow[] = [
      {
        L: 1,
        agrees: true,
        agreesBelow: '6',
        firstMismatch: null,
        implied: series('6', [['1', '1']]),
      },
      {
        L: 2,
        agrees: false,
        agreesBelow: '4',
        firstMismatch: { exponent: '4', computed: '0', supplied: '-2' },
        implied: series('5', [
          ['2', '1'],
          ['4', '-2'],
        ]),
      },
      { L: 3, agrees: null, agreesBelow: null, firstMismatch: null, determined: false },
    ];
    fixture.componentRef.setInput('rows', rows);
    fixture.componentRef.setInput('entered', entered);
    fixture.componentRef.setInput('source', 'Implied by the table');
    fixture.componentRef.setInput('phrase', "implied by the table's rows");
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    const cells = [...el.querySelectorAll('tbody tr')].map((tr) =>
      tr.querySelectorAll('td')[2]!.textContent!.replace(/\s+/g, ' ').trim(),
    );
    expect(el.querySelector('thead')!.textContent).toContain('Implied by the table');
    expect(cells[0]).toMatch(/the same: agrees below q\^6/);
    expect(cells[1]).toMatch(/differs/);
    expect(cells[2]).toMatch(/not compared/);
    // Nothing is shown as the implied Z_3: the rows do not determine it.
    expect(
      el.querySelectorAll('tbody tr')[2]!.querySelector('[data-testid="implied-value"]'),
    ).toBeNull();
    const sides = el.querySelectorAll('[data-testid="side-by-side"]');
    expect(sides).toHaveLength(1);
    expect(sides[0]!.getAttribute('aria-label')).toBe(
      "Z_2: the entered weight (computed) beside the one implied by the table's rows",
    );
  });
});
