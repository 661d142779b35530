import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { testProviders } from '../core/session-testing';
import type { ProductFormDto } from './product-api';
import { ProductRequest } from './product-request';

// Answers shaped as the server gives them for the harmonic trap (Z(2) = q^2/(q;q)_2, Xi =
// (-kappa q^(1/2); q)_inf; Andrews, Theory of Partitions, Cor. 2.2); the server spec checks the
// numbers, this file checks what the screen makes of them.
const ROW: ProductFormDto = {
  runId: 'r1',
  target: 'row',
  N: 2,
  of: 'Z(2)',
  leadingExponent: '2',
  leadingCoefficient: '1',
  product: {
    exponents: Array.from({ length: 30 }, (_, i) => ({ n: String(i + 1), a: i < 2 ? '1' : '0' })),
    step: '1',
    determinedBelow: '18',
    pattern: 'a_n = 0 for n > 2',
    patternNote: 'a finite product on the known range: holds on every known n (n = 1..17)',
  },
};
const GRAND: ProductFormDto = {
  runId: 'r1',
  target: 'grand',
  of: 'Xi',
  factors: [
    {
      N: 1,
      value: {
        order: '20',
        terms: [
          ['1/2', '1'],
          ['3/2', '1'],
        ],
      },
    },
    {
      N: 2,
      value: {
        order: '20',
        terms: [
          ['1', '-1'],
          ['3', '-1'],
        ],
      },
    },
    { N: 3, value: { order: '20', terms: [] } },
  ],
  pattern: 'c_N = 0 for N > 2',
  patternNote:
    'a finite product in kappa on the known range: c_N vanishes to its known order for N = 3..3',
};

describe('ProductRequest', () => {
  let fixture: ComponentFixture<ProductRequest>;
  let el: HTMLElement;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [ProductRequest], providers: testProviders() });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ProductRequest);
    fixture.componentRef.setInput('runId', 'r1');
    fixture.componentRef.setInput('nMax', 5);
    fixture.componentRef.setInput('weightCount', 5);
    el = fixture.nativeElement;
    await fixture.whenStable();
  });
  afterEach(() => http.verify());

  const text = (id: string) => el.querySelector(`[data-testid="${id}"]`)?.textContent ?? '';
  const setIndex = async (v: string) => {
    const input = el.querySelector<HTMLInputElement>('[data-testid="product-index"]')!;
    input.value = v;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  };
  const submit = async () => {
    el.querySelector<HTMLButtonElement>('[data-testid="product-show"]')!.click();
    await fixture.whenStable();
  };

  it('asks for a row and shows its leading term, exponents and pattern', async () => {
    await setIndex('2');
    await submit();
    const req = http.expectOne((r) => r.url === '/api/runs/r1/product-form');
    expect(req.request.params.get('of')).toBe('row');
    expect(req.request.params.get('N')).toBe('2');
    req.flush(ROW);
    await fixture.whenStable();
    expect(text('product-series')).toContain('Leading term q^2 divided out');
    expect(text('product-request-product')).toContain('determined for n < 18');
    expect(text('product-request-product')).toContain('a(2) = 1');
    expect(text('product-request-product')).toContain('first 24 of 30 shown');
    expect(text('product-request-pattern')).toContain('a_n = 0 for n > 2');
    expect(el.querySelector('[data-testid="product-export-csv"]')).not.toBeNull();
  });

  it('names the field for an index out of range, without asking the server', async () => {
    await setIndex('9');
    await submit();
    expect(text('product-field-error')).toBe('N: must be a whole number from 0 to 5.');
    http.expectNone('/api/runs/r1/product-form');
  });

  it('shows the grand function per power of kappa, and a server refusal as sent', async () => {
    fixture.componentInstance['kind'].setValue('grand');
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="product-index"]')).toBeNull();
    await submit();
    const req = http.expectOne((r) => r.url === '/api/runs/r1/product-form');
    expect(req.request.params.get('of')).toBe('grand');
    req.flush(GRAND);
    await fixture.whenStable();
    expect(el.querySelectorAll('[data-testid^="product-factor-"]')).toHaveLength(3);
    expect(text('product-request-pattern')).toContain('c_N = 0 for N > 2');

    fixture.componentInstance['kind'].setValue('weight');
    await fixture.whenStable();
    await setIndex('3');
    await submit();
    http
      .expectOne((r) => r.url === '/api/runs/r1/product-form')
      .flush(
        {
          error: {
            code: 'invalid_input',
            message: 'L: Z_3 is exactly 0: it has no product form.',
            field: 'L',
          },
        },
        { status: 400, statusText: 'Bad Request' },
      );
    await fixture.whenStable();
    expect(text('product-error')).toContain('Z_3 is exactly 0');
    expect(el.querySelector('[data-testid="product-series"]')).toBeNull();
  });
});
