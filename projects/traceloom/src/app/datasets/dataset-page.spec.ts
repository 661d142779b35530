import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { DatasetDto, Role } from '@traceloom/shared/api';
import { signInAs, testProviders } from '../core/session-testing';
import { DatasetPage } from './dataset-page';

const ID = '7a000000-0000-4000-8000-000000000001';
const STUDY = '7a000000-0000-4000-8000-0000000000aa';

function dataset(over: Partial<DatasetDto> = {}): DatasetDto {
  return {
    id: ID,
    studyId: STUDY,
    runId: '7a000000-0000-4000-8000-0000000000bb',
    title: 'Ring kernel, low N',
    version: 1,
    state: 'in_review',
    hash: null,
    lockedAt: null,
    supersedes: null,
    supersededBy: null,
    createdBy: { id: 'a1', displayName: 'Ines Okafor' },
    createdAt: '2026-03-01T10:00:00.000Z',
    updatedAt: '2026-03-01T10:00:00.000Z',
    approved: false,
    readyToLock: false,
    description: '',
    snapshot: {
      gas: { id: 'g1', title: 'ring kernel', version: 2 },
      run: { id: 'r1', finishedAt: null, durationMs: 12 },
      statistics: 'fermion',
      variable: 'q',
      order: '6',
      nMax: 1,
      precision: null,
      known: 'truncated at O(q^6)',
      canonical: [
        { N: 0, value: { order: null, terms: [['0', '1']] } },
        {
          N: 1,
          value: {
            order: '6',
            terms: [
              ['1', '2'],
              ['2', '-1/2'],
            ],
          },
        },
      ],
    },
    checks: [
      {
        check: 'reference',
        label: 'reference',
        N: 1,
        status: 'fails',
        detail: 'differs at exponent 2',
        waiver: null,
      },
    ],
    reviewRequests: [],
    reviews: [],
    comments: [],
    citation: null,
    authors: [{ id: 'a1', displayName: 'Ines Okafor' }],
    authorsEdited: false,
    can: {
      edit: false,
      editAuthors: false,
      requestReview: false,
      review: false,
      waive: true,
      lock: false,
      withdraw: true,
    },
    lockBlockers: ['1 check row(s) fail and are not waived'],
    ...over,
  };
}

describe('DatasetPage', () => {
  let fixture: ComponentFixture<DatasetPage>;
  let http: HttpTestingController;
  let el: HTMLElement;

  async function render(role: Role, d: DatasetDto): Promise<void> {
    sessionStorage.clear();
    TestBed.configureTestingModule({ imports: [DatasetPage], providers: testProviders() });
    http = TestBed.inject(HttpTestingController);
    signInAs(role);
    fixture = TestBed.createComponent(DatasetPage);
    fixture.componentRef.setInput('datasetId', ID);
    el = fixture.nativeElement;
    TestBed.tick();
    http.expectOne(`/api/datasets/${ID}`).flush(d);
    // The study is read once the dataset names it (a resource: answer it before settling).
    await Promise.resolve();
    TestBed.tick();
    http.match(`/api/studies/${STUDY}`).forEach((r) =>
      r.flush({
        id: STUDY,
        owner: { id: 'a1', displayName: 'Ines Okafor' },
        members: [
          { id: 'r1', displayName: 'Tomas Varga', role: 'reviewer' },
          { id: 'a2', displayName: 'Ravi Anand', role: 'author' },
        ],
      }),
    );
    await fixture.whenStable();
  }

  const testId = (id: string) => el.querySelector(`[data-testid="${id}"]`);

  it('shows the state, the Z(N) rows as text and why it cannot be locked yet', async () => {
    await render('steward', dataset());
    expect(testId('dataset-state')?.textContent).toContain('In review');
    expect(testId('dataset-canonical')?.textContent).toContain('2*q - 1/2*q^2 + O(q^6)');
    expect(testId('dataset-lock-blockers')?.textContent).toContain('fail and are not waived');
    expect((testId('dataset-lock') as HTMLButtonElement).disabled).toBe(true);
    expect(testId('dataset-citation')).toBeNull();
    expect(testId('dataset-export-json')).toBeNull();
  });

  it('sends a waiver with the written reason, and refuses one without', async () => {
    await render('steward', dataset());
    (testId('waiver-submit') as HTMLButtonElement).click();
    http.expectNone(`/api/datasets/${ID}/waivers`);
    await fixture.whenStable();
    expect(
      el.querySelector('[data-testid="dataset-checks"] [role="alert"]')?.textContent,
    ).toContain('Write the reason for the waiver first.');
    const input = testId('waiver-reason') as HTMLInputElement;
    input.value = 'Misprint in the preprint.';
    input.dispatchEvent(new Event('input'));
    (testId('waiver-submit') as HTMLButtonElement).click();
    const req = http.expectOne(`/api/datasets/${ID}/waivers`);
    expect(req.request.body).toEqual({
      check: 'reference',
      N: 1,
      reason: 'Misprint in the preprint.',
    });
    req.flush(dataset({ checks: [{ ...dataset().checks[0]!, status: 'waived' }] }));
    await fixture.whenStable();
    expect(el.querySelector('tr.is-waived')).not.toBeNull();
  });

  it('says "Approved, ready to lock" and locks only after a confirmation naming the hash', async () => {
    const ready = dataset({
      approved: true,
      readyToLock: true,
      checks: [],
      lockBlockers: [],
      can: { ...dataset().can, lock: true },
    });
    await render('steward', ready);
    expect(testId('dataset-state')?.textContent).toContain('Approved, ready to lock');
    (testId('dataset-lock') as HTMLButtonElement).click();
    http.expectNone(`/api/datasets/${ID}/lock`);
    const hash = 'cd'.repeat(32);
    const lockedAt = '2026-03-02T09:00:00.000Z';
    const freezes = ['the canonical table Z(0)..Z(1) to O(q^6)', '0 check rows (0 waived)'];
    http.expectOne(`/api/datasets/${ID}/lock-preview`).flush({ hash, lockedAt, freezes });
    await fixture.whenStable();
    const dialog = () => document.querySelector('tl-confirm-dialog');
    expect(dialog()?.querySelector('[data-testid="confirm-code"]')?.textContent).toBe(hash);
    expect(dialog()?.querySelector('[data-testid="confirm-items"]')?.textContent).toContain(
      'Z(0)..Z(1)',
    );
    http.expectNone(`/api/datasets/${ID}/lock`);
    (dialog()?.querySelector('[data-testid="confirm-yes"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    const req = http.expectOne(`/api/datasets/${ID}/lock`);
    expect(req.request.body).toEqual({ lockedAt, hash });
  });

  it('shows the citation and the hashed JSON export once locked', async () => {
    const hash = 'ab'.repeat(32);
    await render(
      'reviewer',
      dataset({
        state: 'locked',
        hash,
        lockedAt: '2026-03-02T09:00:00.000Z',
        citation: `Ring kernel, low N, version 1, Traceloom dataset locked 2026-03-02, SHA-256 ${hash}.`,
        checks: [],
        lockBlockers: [],
        can: {
          edit: false,
          editAuthors: false,
          requestReview: false,
          review: false,
          waive: false,
          lock: false,
          withdraw: false,
        },
      }),
    );
    expect(testId('dataset-citation')?.textContent).toContain(hash);
    expect(testId('dataset-export-json')).not.toBeNull();
    expect(testId('dataset-public-link')?.getAttribute('href')).toBe(`/public/${hash}`);
    expect(testId('dataset-lock')).toBeNull();
  });

  it('names the authors, and lets the maker add, reorder and save them before the lock', async () => {
    await render('author', dataset({ can: { ...dataset().can, editAuthors: true } }));
    const section = () => testId('dataset-authors')!.textContent!;
    expect(section()).toContain('Ines Okafor');
    expect(section()).toContain('the reviewers who approved it');
    (testId('dataset-authors-edit') as HTMLButtonElement).click();
    await fixture.whenStable();
    // Add Ravi Anand through the Material select, as a person would (open it, pick the option).
    (
      el.querySelector('[data-testid="dataset-author-add"] .mat-mdc-select-trigger') as HTMLElement
    ).click();
    await fixture.whenStable();
    const option = [...document.querySelectorAll('mat-option')].find((o) =>
      o.textContent!.includes('Ravi Anand'),
    ) as HTMLElement;
    option.click();
    await fixture.whenStable();
    (el.querySelector('[aria-label="Move Ravi Anand up"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    const rows = [...el.querySelectorAll('[data-testid="dataset-author-row"]')];
    expect(rows.map((r) => r.querySelector('.name')!.textContent!.trim())).toEqual([
      'Ravi Anand',
      'Ines Okafor',
    ]);
    (testId('dataset-authors-save') as HTMLButtonElement).click();
    const req = http.expectOne(`/api/datasets/${ID}`);
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ authors: ['a2', 'a1'] });
    req.flush(
      dataset({
        authorsEdited: true,
        authors: [
          { id: 'a2', displayName: 'Ravi Anand' },
          { id: 'a1', displayName: 'Ines Okafor' },
        ],
      }),
    );
    await fixture.whenStable();
    expect(testId('dataset-authors-list')?.textContent).toContain('Ravi Anand, Ines Okafor');
    expect(section()).toContain('a lock freezes them');
  });

  it('offers no author editing to someone who may not', async () => {
    await render('reviewer', dataset());
    expect(testId('dataset-authors-list')?.textContent).toContain('Ines Okafor');
    expect(testId('dataset-authors-edit')).toBeNull();
  });
});
