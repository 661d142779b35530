import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Role, StudyDto } from '@traceloom/shared/api';
import { signInAs, testProviders, testUser } from '../core/session-testing';
import { StudyPage } from './study-page';

const author = testUser('author');
const reviewer = testUser('reviewer');
const STUDY: StudyDto = {
  id: 'study-7',
  title: 'Harmonic trap',
  description: 'Closed form as a check.',
  owner: { id: author.id, displayName: author.displayName, email: author.email },
  members: [
    { id: reviewer.id, displayName: reviewer.displayName, email: reviewer.email, role: 'reviewer' },
  ],
  createdAt: '2026-02-01T10:00:00.000Z',
  updatedAt: '2026-02-01T10:00:00.000Z',
  memberCount: 2,
  lastChangeAt: '2026-02-01T10:00:00.000Z',
};

describe('StudyPage', () => {
  let fixture: ComponentFixture<StudyPage>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;

  async function render(role: Role, answer: (url: string) => void, loads = true): Promise<void> {
    sessionStorage.clear();
    TestBed.configureTestingModule({
      imports: [StudyPage],
      providers: testProviders(),
    });
    httpTesting = TestBed.inject(HttpTestingController);
    signInAs(role);
    fixture = TestBed.createComponent(StudyPage);
    fixture.componentRef.setInput('id', STUDY.id);
    el = fixture.nativeElement;
    TestBed.tick();
    answer('/api/studies/study-7');
    if (loads) {
      // The study's gases and reference tables (tl-study-gases) load once the study is shown.
      await vi.waitFor(() => {
        TestBed.tick();
        httpTesting.expectOne('/api/studies/study-7/gases').flush([]);
      });
      httpTesting.expectOne('/api/studies/study-7/references').flush([]);
    }
    if (role === 'author' && loads) {
      // The owner's page also asks for the directory (member picker) once the study is shown;
      // whenStable() would wait for that request forever, so answer it first.
      await vi.waitFor(() => {
        TestBed.tick();
        httpTesting.expectOne('/api/users/directory').flush([]);
      });
    }
    await fixture.whenStable();
  }

  const one = <T extends Element>(id: string) => el.querySelector(`[data-testid="${id}"]`) as T;
  const ok = (url: string) => httpTesting.expectOne(url).flush(STUDY);

  afterEach(() => httpTesting.verify());

  it('does not reveal whether a study it cannot show exists', async () => {
    await render(
      'author',
      (url) =>
        httpTesting
          .expectOne(url)
          .flush(
            { error: { code: 'not_found', message: 'No such study.' } },
            { status: 404, statusText: 'Not Found' },
          ),
      false,
    );
    expect(one('study-error').textContent).toContain(
      'This study does not exist, or you are not one of its members.',
    );
    expect(one('study-heading')).toBeNull();
  });

  it('lets the owner edit and delete, and sends the trimmed title', async () => {
    await render('author', ok);
    expect(one('study-heading').textContent).toContain('Harmonic trap');
    expect(one('study-delete')).not.toBeNull();
    const title = one<HTMLInputElement>('study-edit-title');
    expect(title.disabled).toBe(false);
    title.value = '  Harmonic trap, N up to 12  ';
    title.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    one<HTMLButtonElement>('study-edit-save').click();
    const req = httpTesting.expectOne('/api/studies/study-7');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({
      title: 'Harmonic trap, N up to 12',
      description: 'Closed form as a check.',
    });
    req.flush({ ...STUDY, title: 'Harmonic trap, N up to 12' });
    await fixture.whenStable();
    expect(one('study-heading').textContent).toContain('Harmonic trap, N up to 12');
  });

  it("puts the server's field error under the field it names", async () => {
    await render('author', ok);
    const title = one<HTMLInputElement>('study-edit-title');
    title.value = 'Renamed';
    title.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    one<HTMLButtonElement>('study-edit-save').click();
    httpTesting.expectOne('/api/studies/study-7').flush(
      {
        error: {
          code: 'invalid_body',
          message: 'A study with this title exists.',
          field: 'body.title',
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    const error = title.closest('mat-form-field')?.querySelector('mat-error');
    expect(error?.textContent).toContain('A study with this title exists.');
  });

  it('shows a reviewer member the study read-only', async () => {
    await render('reviewer', ok);
    expect(one<HTMLInputElement>('study-edit-title').disabled).toBe(true);
    expect(one('study-edit-save')).toBeNull();
    expect(one('study-delete')).toBeNull();
    expect(el.textContent).toContain(
      'Only the owner, an admin, or an author or steward member may edit.',
    );
  });
});
