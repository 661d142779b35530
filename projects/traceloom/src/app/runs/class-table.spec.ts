import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { ClassRowJson } from '@traceloom/shared/engine';
import { ClassTable } from './class-table';
import { testProviders } from '../core/session-testing';

/**
 * S_4: five cycle types with class sizes 1^4: 1, 1^2 2: 6, 2^2: 3, 1 3: 8, 4: 6 (Abramowitz &
 * Stegun Table 24.2); fermion signs (-1)^(N - cycles). Contributions are placeholders: the table
 * only displays what the run computed.
 */
const S4: ClassRowJson[] = [
  {
    N: 4,
    cycleType: [[1, 4]],
    size: '1',
    sign: 1,
    contribution: { order: '8', terms: [['2', '1/24']] },
  },
  {
    N: 4,
    cycleType: [
      [1, 2],
      [2, 1],
    ],
    size: '6',
    sign: -1,
    contribution: { order: '8', terms: [['3', '-1/4']] },
  },
  {
    N: 4,
    cycleType: [[2, 2]],
    size: '3',
    sign: 1,
    contribution: { order: '8', terms: [['4', '1/8']] },
  },
  {
    N: 4,
    cycleType: [
      [1, 1],
      [3, 1],
    ],
    size: '8',
    sign: 1,
    contribution: { order: '8', terms: [['2', '1/3']] },
  },
  {
    N: 4,
    cycleType: [[4, 1]],
    size: '6',
    sign: -1,
    contribution: { order: '8', terms: [['4', '-1/4']] },
  },
];

describe('ClassTable', () => {
  let fixture: ComponentFixture<ClassTable>;
  let http: HttpTestingController;
  let el: HTMLElement;

  async function render(counts: Record<string, number>): Promise<void> {
    TestBed.configureTestingModule({
      imports: [ClassTable],
      providers: testProviders(),
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ClassTable);
    fixture.componentRef.setInput('runId', 'run-1');
    fixture.componentRef.setInput('counts', counts);
    el = fixture.nativeElement;
    TestBed.tick();
  }

  afterEach(() => http.verify());

  const column = (i: number) =>
    [...el.querySelectorAll('[data-testid="class-row"]')].map((r) =>
      (r.querySelectorAll('td')[i] as HTMLElement).textContent?.trim(),
    );

  it('loads the class table of the largest N and shows cycle types in exponent notation', async () => {
    await render({ '1': 1, '2': 2, '3': 3, '4': 5 });
    const req = http.expectOne(
      (r) => r.url === '/api/runs/run-1' && r.params.get('classes') === '4',
    );
    req.flush({ result: { classes: S4 } });
    await fixture.whenStable();
    const plain = [...el.querySelectorAll('[data-testid="class-row"] td[data-plain]')].map((td) =>
      td.getAttribute('data-plain'),
    );
    expect(plain).toEqual(['1^4', '1^2 2^1', '2^2', '1^1 3^1', '4^1']);
    expect(column(1)).toEqual(['1', '6', '3', '8', '6']);
    expect(column(2)).toEqual(['+1', '−1', '+1', '+1', '−1']);
  });

  it('sorts by class size when the header is clicked', async () => {
    await render({ '4': 5 });
    http.expectOne((r) => r.params.get('classes') === '4').flush({ result: { classes: S4 } });
    await fixture.whenStable();
    const header = el.querySelectorAll('th[mat-sort-header]')[1] as HTMLElement;
    header.click();
    await fixture.whenStable();
    expect(column(1)).toEqual(['1', '3', '6', '6', '8']);
    header.click();
    await fixture.whenStable();
    expect(column(1)).toEqual(['8', '6', '6', '3', '1']);
  });

  it('pages long tables, 25 rows a page', async () => {
    await render({ '9': 30 });
    // 30 placeholder rows (p(9) = 30 cycle types, OEIS A000041); only the paging is under test.
    const rows = Array.from({ length: 30 }, (_, i) => ({ ...S4[0]!, N: 9, size: String(i + 1) }));
    http.expectOne((r) => r.params.get('classes') === '9').flush({ result: { classes: rows } });
    await fixture.whenStable();
    expect(el.querySelectorAll('[data-testid="class-row"]').length).toBe(25);
    (el.querySelector('button.mat-mdc-paginator-navigation-next') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(column(1)).toEqual(['26', '27', '28', '29', '30']);
  });

  it('says when the run has no class table', async () => {
    await render({});
    expect(el.querySelector('[data-testid="classes-empty"]')?.textContent).toContain(
      'no class table',
    );
  });

  it('shows an error when the class table cannot be loaded', async () => {
    await render({ '3': 3 });
    http
      .expectOne((r) => r.params.get('classes') === '3')
      .flush(
        { error: { code: 'not_found', message: 'The run was not found.' } },
        { status: 404, statusText: 'Not Found' },
      );
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="classes-error"]')?.textContent).toContain(
      'The run was not found.',
    );
  });
});
