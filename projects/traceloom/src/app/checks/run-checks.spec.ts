import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { ComparisonDto, RunDto } from '@traceloom/shared/api';
import { signInAs, testProviders } from '../core/session-testing';
import { RunChecks } from './run-checks';

const RUN = { id: 'run-1', studyId: 'study-1', spec: { variable: 'q' }, result: null };

function comparison(id: string, createdAt: string): ComparisonDto {
  return {
    id,
    runId: 'run-1',
    referenceId: null,
    kind: 'grand',
    normalization: '1',
    rows: [],
    summary: { agreeing: 0, total: 0 },
    impliedWeights: null,
    createdAt,
  };
}

describe('RunChecks', () => {
  async function render() {
    sessionStorage.clear();
    TestBed.configureTestingModule({ imports: [RunChecks], providers: testProviders() });
    const http = TestBed.inject(HttpTestingController);
    signInAs('author');
    const fixture = TestBed.createComponent(RunChecks);
    fixture.componentRef.setInput('run', RUN as unknown as RunDto);
    TestBed.tick();
    return { http, fixture, el: fixture.nativeElement as HTMLElement };
  }

  it('lists the stored comparisons newest first and reads nothing again for a new copy of the same run', async () => {
    const { http, fixture, el } = await render();
    expect(el.querySelector('mat-progress-bar[aria-label="Loading comparisons"]')).not.toBeNull();
    http.expectOne('/api/studies/study-1/references').flush([]);
    http
      .expectOne('/api/runs/run-1/comparisons')
      .flush([
        comparison('c-old', '2026-01-01T00:00:00.000Z'),
        comparison('c-new', '2026-02-01T00:00:00.000Z'),
      ]);
    await fixture.whenStable();
    const times = [...el.querySelectorAll('[data-testid="comparison"] time')].map((t) =>
      t.getAttribute('datetime'),
    );
    expect(times).toEqual(['2026-02-01T00:00:00.000Z', '2026-01-01T00:00:00.000Z']);

    fixture.componentRef.setInput('run', { ...RUN } as unknown as RunDto);
    TestBed.tick();
    http.verify();
    await fixture.whenStable();
    expect(el.querySelectorAll('[data-testid="comparison"]').length).toBe(2);
  });

  it('says why the comparisons or the reference tables could not be read', async () => {
    const { http, fixture, el } = await render();
    http
      .expectOne('/api/studies/study-1/references')
      .flush(
        { error: { code: 'forbidden', message: 'You are not a member of this study.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    http
      .expectOne('/api/runs/run-1/comparisons')
      .flush(
        { error: { code: 'internal', message: 'The server could not answer.' } },
        { status: 500, statusText: 'Server Error' },
      );
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="checks-error"]')?.textContent).toContain(
      'You are not a member of this study.',
    );
    expect(el.querySelector('[data-testid="comparisons-error"]')?.textContent).toContain(
      'The server could not answer.',
    );
    expect(el.querySelector('[data-testid="comparisons-empty"]')).toBeNull();
    http.verify();
  });

  it('says when the run has no comparisons yet', async () => {
    const { http, fixture, el } = await render();
    http.expectOne('/api/studies/study-1/references').flush([]);
    http.expectOne('/api/runs/run-1/comparisons').flush([]);
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="comparisons-empty"]')?.textContent).toContain(
      'No comparisons for this run yet.',
    );
    http.verify();
  });
});
