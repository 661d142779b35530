import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { signInAs, testProviders, testUser } from '../core/session-testing';
import type { ReferenceComparisonDto, ReferenceDto } from '../checks/checks-api';
import { ReferencePage } from './reference-page';

const ID = '7c000000-0000-4000-8000-000000000001';
const STUDY = '5a000000-0000-4000-8000-000000000001';

function table(rowCount: number, createdBy = { id: 'someone', displayName: 'Ines Okafor' }) {
  return {
    id: ID,
    studyId: STUDY,
    title: 'Table 2 of the note',
    filename: 'note.csv',
    contentType: 'text/csv',
    sha256: '0'.repeat(64),
    numeric: false,
    normalization: 'q^(-N^2/2)',
    variable: 'q',
    note: '',
    createdAt: '2026-03-01T10:00:00.000Z',
    createdBy,
    rows: Array.from({ length: rowCount }, (_, N) => ({
      line: N + 2,
      N,
      value: `${N + 1}`,
      note: '',
    })),
  } satisfies ReferenceDto;
}

const COMPARISON: ReferenceComparisonDto = {
  id: 'c1',
  runId: '9d000000-0000-4000-8000-000000000001',
  gasId: 'g1',
  gasTitle: 'Harmonic trap',
  gasVersion: 3,
  normalization: 'q^(-N^2/2)',
  summary: { agreeing: 2, total: 3 },
  createdAt: '2026-03-02T10:00:00.000Z',
};

async function open(role: 'author' | 'reviewer', dto: ReferenceDto) {
  sessionStorage.clear();
  TestBed.configureTestingModule({ imports: [ReferencePage], providers: testProviders() });
  const http = TestBed.inject(HttpTestingController);
  signInAs(role);
  const fixture = TestBed.createComponent(ReferencePage);
  fixture.componentRef.setInput('referenceId', ID);
  TestBed.tick();
  http.expectOne(`/api/references/${ID}`).flush(dto);
  http.expectOne(`/api/references/${ID}/comparisons`).flush([COMPARISON]);
  // the resources hand their answers on in a microtask
  await Promise.resolve();
  TestBed.tick();
  http.expectOne(`/api/studies/${STUDY}`).flush({ title: 'Trap study' });
  http
    .expectOne(`/api/studies/${STUDY}/gases`)
    .flush([{ id: 'g1', title: 'Harmonic trap', studyId: STUDY }]);
  http.expectOne('/api/gases/g1/runs').flush([
    {
      id: 'r-done',
      gasId: 'g1',
      gasVersion: 3,
      status: 'done',
      createdAt: '2026-03-02T09:00:00Z',
      finishedAt: '2026-03-02T09:01:00Z',
    },
    {
      id: 'r-failed',
      gasId: 'g1',
      gasVersion: 3,
      status: 'failed',
      createdAt: '2026-03-02T08:00:00Z',
      finishedAt: null,
    },
  ]);
  await fixture.whenStable();
  return { el: fixture.nativeElement as HTMLElement, http, fixture };
}

describe('ReferencePage', () => {
  it('shows the rows, the study in the breadcrumb and each comparison linked to its run', async () => {
    const { el, http } = await open('author', table(3));
    expect(el.querySelector('nav.crumbs')?.textContent).toContain('Trap study');
    expect(el.querySelectorAll('[data-testid="reference-page-row"]')).toHaveLength(3);
    const cmp = el.querySelector('[data-testid="reference-comparison"]')!;
    expect(cmp.textContent).toContain('Harmonic trap, version 3');
    expect(cmp.textContent).toContain('2 of 3 rows agree');
    expect(cmp.querySelector('a')?.getAttribute('href')).toBe(`/runs/${COMPARISON.runId}`);
    expect(el.textContent).toContain('Delete table');
    http.verify();
  });

  it('scrolls a long table virtually instead of rendering every row', async () => {
    const { el } = await open('author', table(500));
    expect(el.querySelector('cdk-virtual-scroll-viewport')).not.toBeNull();
    expect(el.querySelectorAll('[data-testid="reference-page-row"]').length).toBeLessThan(500);
  });

  it('offers edit and delete to the uploader only among reviewers; a server error lands on its field', async () => {
    const { el } = await open('reviewer', table(2));
    expect(el.textContent).not.toContain('Delete table');
    expect(el.querySelector('#ref-edit-title')).toBeNull();
    TestBed.resetTestingModule();
    const own = await open(
      'reviewer',
      table(2, { id: testUser('reviewer').id, displayName: 'Me' }),
    );
    expect(own.el.querySelector('#ref-edit-title')).not.toBeNull();
    const input = own.el.querySelectorAll('input')[1] as HTMLInputElement;
    input.value = 'x^N';
    input.dispatchEvent(new Event('input'));
    own.el.querySelector('form')!.dispatchEvent(new Event('submit'));
    own.http.expectOne({ method: 'PATCH', url: `/api/references/${ID}` }).flush(
      {
        error: {
          code: 'invalid_input',
          message: 'normalization: unknown symbol x (it may use N and the variable q).',
          field: 'normalization',
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    own.fixture.detectChanges();
    await own.fixture.whenStable();
    expect(own.el.textContent).toContain('unknown symbol x');
  });
});
