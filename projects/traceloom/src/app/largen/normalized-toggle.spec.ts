import { ComponentFixture, TestBed } from '@angular/core/testing';
import { testProviders } from '../core/session-testing';
import { CanonicalTable } from '../runs/canonical-table';
import { TRAP_LARGE_N } from './large-n-fixture';

/**
 * The canonical table's "normalized" toggle, driven by the large-N block. Harmonic trap, fermions:
 * Z(N) = q^(N^2/2)/(q;q)_N (Andrews, Theory of Partitions, Cor. 2.2), normalized 1 + q + 2q^2 + ...
 */
function trapRow(N: number) {
  const lead = (N * N) / 2;
  const e = (k: number) => (Number.isInteger(lead + k) ? `${lead + k}` : `${2 * (lead + k)}/2`);
  return {
    N,
    value: {
      order: '30',
      terms: (N === 0
        ? [['0', '1']]
        : [
            [e(0), '1'],
            [e(1), '1'],
            [e(2), '2'],
          ]) as [string, string][],
    },
    routes: ['recursion'] as const,
    agrees: true,
  };
}

describe('canonical table: normalized toggle', () => {
  let fixture: ComponentFixture<CanonicalTable>;
  let el: HTMLElement;

  async function render(result: unknown): Promise<void> {
    TestBed.configureTestingModule({ imports: [CanonicalTable], providers: testProviders() });
    fixture = TestBed.createComponent(CanonicalTable);
    fixture.componentRef.setInput('rows', [0, 1, 2, 3, 4, 5, 6].map(trapRow));
    fixture.componentRef.setInput('result', result);
    el = fixture.nativeElement;
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 50));
    await fixture.whenStable();
  }
  const lead = (N: number) =>
    el.querySelector(`[data-testid="canonical-lead-${N}"]`)?.getAttribute('data-plain');

  it('switches the rows to q^(-N^2/2) Z(N) and back', async () => {
    await render({ largeN: TRAP_LARGE_N });
    expect(lead(3)).toBe('q^(9/2)');
    const button = el.querySelector<HTMLButtonElement>('[data-testid="canonical-normalized"]')!;
    button.click();
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 50));
    await fixture.whenStable();
    expect(lead(3)).toBe('1');
    expect(button.getAttribute('aria-pressed')).toBe('true');
  });

  it('has no toggle without a large-N block', async () => {
    await render({});
    expect(el.querySelector('[data-testid="canonical-normalized"]')).toBeNull();
  });
});
