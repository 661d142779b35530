import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Role, StudyDto } from '@traceloom/shared/api';
import { signInAs, testProviders } from '../core/session-testing';
import { StudyList } from './study-list';

const RING: StudyDto = {
  id: '6f1c2d3e-0000-4000-8000-000000000001',
  title: 'Fermions on a ring',
  description: '',
  owner: { id: 'o1', displayName: 'Noor Halloran', email: 'noor@example.test' },
  members: [{ id: 'm1', displayName: 'Ilse Varga', email: 'ilse@example.test', role: 'reviewer' }],
  createdAt: '2026-02-01T10:00:00.000Z',
  updatedAt: '2026-02-03T10:00:00.000Z',
  memberCount: 2,
  lastChangeAt: '2026-02-03T10:00:00.000Z',
};

describe('StudyList', () => {
  let fixture: ComponentFixture<StudyList>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;

  function render(role: Role = 'author'): void {
    sessionStorage.clear();
    TestBed.configureTestingModule({
      imports: [StudyList],
      providers: testProviders(),
    });
    httpTesting = TestBed.inject(HttpTestingController);
    signInAs(role);
    fixture = TestBed.createComponent(StudyList);
    el = fixture.nativeElement;
    // Not whenStable(): the pending request keeps the app unstable until it is answered.
    TestBed.tick();
  }

  const testId = (id: string) => el.querySelector(`[data-testid="${id}"]`);

  afterEach(() => httpTesting.verify());

  it('shows a loading bar until the list arrives', async () => {
    render();
    const req = httpTesting.expectOne('/api/studies');
    expect(req.request.headers.get('Authorization')).toBe('Bearer token-author');
    expect(testId('studies-loading')).not.toBeNull();
    expect(testId('studies-empty')).toBeNull();
    req.flush([]);
    await fixture.whenStable();
    expect(testId('studies-loading')).toBeNull();
  });

  it('says so when there are no studies, and how to start one', async () => {
    render();
    httpTesting.expectOne('/api/studies').flush([]);
    await fixture.whenStable();
    expect(testId('studies-empty')?.textContent).toContain('No studies yet.');
    expect(testId('studies-empty')?.textContent).toContain('New study');
    expect(el.querySelectorAll('[data-testid="study-row"]').length).toBe(0);
  });

  it("shows the server's message and a retry when the list fails", async () => {
    render();
    httpTesting
      .expectOne('/api/studies')
      .flush(
        { error: { code: 'internal', message: 'The database is not answering.' } },
        { status: 500, statusText: 'Server Error' },
      );
    await fixture.whenStable();
    const error = testId('studies-error');
    expect(error?.getAttribute('role')).toBe('alert');
    expect(error?.textContent).toContain('The database is not answering.');
    (error?.querySelector('button') as HTMLButtonElement).click();
    TestBed.tick();
    httpTesting.expectOne('/api/studies').flush([RING]);
    await fixture.whenStable();
    expect(testId('studies-error')).toBeNull();
    expect(el.querySelectorAll('[data-testid="study-row"]').length).toBe(1);
  });

  it('lists each study with its owner, member count and a link to its page', async () => {
    render();
    httpTesting.expectOne('/api/studies').flush([
      { ...RING, lastChangeAt: '2026-02-09T10:00:00.000Z' },
      { ...RING, id: 'x2', title: 'Harmonic trap', members: [], memberCount: 1 },
    ]);
    await fixture.whenStable();
    const rows = [...el.querySelectorAll('[data-testid="study-row"]')];
    expect(rows.map((r) => r.querySelector('a')?.textContent?.trim())).toEqual([
      'Fermions on a ring',
      'Harmonic trap',
    ]);
    expect(rows[0].textContent).toContain('Noor Halloran');
    // The owner and one member: two people; the date is the latest change inside the study.
    expect(rows[0].querySelector('.num')?.textContent?.trim()).toBe('2');
    expect(rows[1].querySelector('.num')?.textContent?.trim()).toBe('1');
    expect(rows[0].querySelector('time')?.getAttribute('datetime')).toBe(
      '2026-02-09T10:00:00.000Z',
    );
    expect(rows[0].querySelector('a')?.getAttribute('href')).toBe(`/studies/${RING.id}`);
  });

  it.each<[Role, boolean]>([
    ['author', true],
    ['steward', true],
    ['admin', true],
    ['reviewer', false],
  ])('offers "New study" to %s: %s', async (role, offered) => {
    render(role);
    httpTesting.expectOne('/api/studies').flush([]);
    await fixture.whenStable();
    expect(testId('study-create') !== null).toBe(offered);
  });
});
