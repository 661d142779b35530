import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { signInAs, testProviders } from '../core/session-testing';
import { StudyGases } from './study-gases';

const GAS = {
  id: 'gas-1',
  title: 'Trap gas',
  statistics: 'fermion',
  weightsKind: 'values',
  version: 3,
  lastRun: null,
  updatedAt: '2026-01-02T00:00:00.000Z',
  updatedBy: { id: 'u1', displayName: 'Ada' },
};

describe('StudyGases', () => {
  async function render(studyId: string) {
    sessionStorage.clear();
    TestBed.configureTestingModule({ imports: [StudyGases], providers: testProviders() });
    const http = TestBed.inject(HttpTestingController);
    signInAs('author');
    const fixture = TestBed.createComponent(StudyGases);
    fixture.componentRef.setInput('studyId', studyId);
    TestBed.tick();
    return { http, fixture, el: fixture.nativeElement as HTMLElement };
  }

  it('shows the gases, says when there are no reference tables, and offers to retry a failed list', async () => {
    const { http, fixture, el } = await render('study-1');
    expect(el.querySelector('mat-progress-bar[aria-label="Loading the gases"]')).not.toBeNull();
    http
      .expectOne('/api/studies/study-1/gases')
      .flush(
        { error: { code: 'internal', message: 'The server could not answer.' } },
        { status: 500, statusText: 'Server Error' },
      );
    http.expectOne('/api/studies/study-1/references').flush([]);
    await fixture.whenStable();
    const error = el.querySelector('[data-testid="gases-error"]')!;
    expect(error.textContent).toContain(
      'The gases could not be loaded: The server could not answer.',
    );
    expect(el.querySelector('[data-testid="references-empty"]')?.textContent).toContain(
      'No reference tables yet.',
    );

    (error.querySelector('button') as HTMLButtonElement).click();
    TestBed.tick();
    http.expectOne('/api/studies/study-1/gases').flush([GAS]);
    http.expectOne('/api/studies/study-1/references').flush([]);
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="gases-error"]')).toBeNull();
    expect(el.querySelector('[data-testid="gas-link"]')?.textContent).toBe('Trap gas');
    http.verify();
  });

  it('reads the new study when the study changes, dropping the old request', async () => {
    const { http, fixture, el } = await render('study-1');
    const old = http.expectOne('/api/studies/study-1/gases');
    http.expectOne('/api/studies/study-1/references').flush([]);
    fixture.componentRef.setInput('studyId', 'study-2');
    TestBed.tick();
    expect(old.cancelled).toBe(true);
    http.expectOne('/api/studies/study-2/gases').flush([]);
    http.expectOne('/api/studies/study-2/references').flush([]);
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="gases-empty"]')?.textContent).toContain(
      '“New gas” defines one',
    );
    http.verify();
  });
});
